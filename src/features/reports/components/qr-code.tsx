import { useMemo } from "react";
import QRCode from "qrcode";

/** A QR code drawn as one SVG path (sharp at any size), with a white quiet zone of two modules. */
export function QrCode({ text, size = 96, label }: { text: string; size?: number; label: string }) {
  const { n, path } = useMemo(() => {
    // Medium error correction, as on the printed labels: survives a smudge or a crease.
    const qr = QRCode.create(text, { errorCorrectionLevel: "M" });
    const m = qr.modules;
    let d = "";
    for (let r = 0; r < m.size; r++) for (let c = 0; c < m.size; c++) if (m.get(r, c)) d += `M${c + 2} ${r + 2}h1v1h-1z`;
    return { n: m.size + 4, path: d };
  }, [text]);
  return (
    <svg
      role="img"
      aria-label={label}
      width={size}
      height={size}
      viewBox={`0 0 ${n} ${n}`}
      shapeRendering="crispEdges"
      className="shrink-0 bg-white"
    >
      <rect width={n} height={n} fill="#fff" />
      <path d={path} fill="#000" />
    </svg>
  );
}
