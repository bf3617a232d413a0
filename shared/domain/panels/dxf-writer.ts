// Pattern pieces written as ASCII DXF following the ASTM D6673 conventions (layer numbers in
// astm-d6673.ts): each piece is a BLOCK placed once by an INSERT at the origin, holding its cut line
// (layer 1, the sew line offset outward by the seam allowance with clipper-lib), sew line (layer 14),
// grain line (layer 7), notches (layer 4: a LINE from the cut line in to the sew line) and the texts
// "Piece Name: …", "Quantity: n" and, for mirrored pairs, "Annotation: cut as mirrored pairs".
// R12 entities (POLYLINE/VERTEX/SEQEND, LINE, TEXT, INSERT), units declared as millimetres.
// Non-ASCII characters are written as \U+XXXX, the DXF escape for characters outside the code page.
import { signedArea, type PanelShape, type Point } from "./geometry";
import { cutLineFromSewLine } from "./offset";
import { interiorPoint } from "./triangulate";
import { ASTM_LAYER, ASTM_TEXT_LABEL } from "./astm-d6673";

/** Notch tick length drawn into a piece without seam allowance, mm (about ¼ in; common practice, no source). */
const NOTCH_DEPTH_MM = 6;
const TEXT_HEIGHT_MM = 10;
/** The annotation that marks copies cut as mirrored (left and right) pairs. */
export const MIRRORED_ANNOTATION = "cut as mirrored pairs";

function num(v: number): string {
  if (Object.is(v, -0)) return "0";
  const s = String(v);
  // Plain decimals keep every digit; exponent forms (very small or large) are spelled out.
  return s.includes("e") ? v.toFixed(15).replace(/\.?0+$/, "") : s;
}

/** Escapes text for a DXF group value: non-ASCII and edge spaces as \U+XXXX, backslash doubled. */
export function encodeDxfText(s: string): string {
  let out = "";
  const chars = [...s.replace(/[\r\n]+/g, " ")];
  chars.forEach((ch, i) => {
    const cp = ch.codePointAt(0)!;
    const edgeSpace = ch === " " && (i === 0 || i === chars.length - 1);
    if (ch === "\\") out += "\\\\";
    else if (cp > 126 || cp < 32 || edgeSpace) {
      // Characters beyond the BMP are written as their UTF-16 halves, each as \U+XXXX.
      for (const unit of ch.split("")) out += `\\U+${unit.charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}`;
    } else out += ch;
  });
  return out;
}

/** R12 block names: at most 31 characters of letters, digits, "_", "-", "$". */
export function pieceBlockName(index: number, name: string): string {
  const clean = name
    .normalize("NFKD")
    .replace(/\p{M}+/gu, "")
    .toUpperCase()
    .replace(/[^A-Z0-9_-]+/g, "_")
    .replace(/^_+|_+$/g, "");
  return `PIECE_${index + 1}${clean ? `_${clean}` : ""}`.slice(0, 31);
}

/** Writes pieces as one ASCII DXF (millimetres), one BLOCK per piece. */
export function panelsToDxf(panels: readonly PanelShape[]): string {
  const out: string[] = [];
  const g = (code: number, value: string | number) => {
    out.push(String(code), typeof value === "number" ? num(value) : value);
  };
  const blocks = panels.map((p, i) => pieceBlockName(i, p.name));
  const layers = [
    "0",
    ...[ASTM_LAYER.cutLine, ASTM_LAYER.notches, ASTM_LAYER.grainLine, ASTM_LAYER.sewLine, ASTM_LAYER.annotation].map(String),
  ];

  g(0, "SECTION");
  g(2, "HEADER");
  g(9, "$ACADVER");
  g(1, "AC1009");
  g(9, "$INSUNITS");
  g(70, "4");
  g(9, "$MEASUREMENT");
  g(70, "1");
  g(0, "ENDSEC");

  g(0, "SECTION");
  g(2, "TABLES");
  g(0, "TABLE");
  g(2, "LAYER");
  g(70, String(layers.length));
  for (const name of layers) {
    g(0, "LAYER");
    g(2, name);
    g(70, "0");
    g(62, "7");
    g(6, "CONTINUOUS");
  }
  g(0, "ENDTAB");
  g(0, "ENDSEC");

  const polyline = (layer: number, pts: readonly Point[]) => {
    g(0, "POLYLINE");
    g(8, String(layer));
    g(66, "1");
    g(10, 0);
    g(20, 0);
    g(30, 0);
    g(70, "1");
    for (const [x, y] of pts) {
      g(0, "VERTEX");
      g(8, String(layer));
      g(10, x);
      g(20, y);
      g(30, 0);
    }
    g(0, "SEQEND");
    g(8, String(layer));
  };
  const line = (layer: number, a: Point, b: Point) => {
    g(0, "LINE");
    g(8, String(layer));
    g(10, a[0]);
    g(20, a[1]);
    g(30, 0);
    g(11, b[0]);
    g(21, b[1]);
    g(31, 0);
  };
  const text = (layer: number, at: Point, value: string) => {
    g(0, "TEXT");
    g(8, String(layer));
    g(10, at[0]);
    g(20, at[1]);
    g(30, 0);
    g(40, TEXT_HEIGHT_MM);
    g(1, encodeDxfText(value));
  };

  g(0, "SECTION");
  g(2, "BLOCKS");
  panels.forEach((panel, i) => {
    const sew = panel.outline;
    const allowance = panel.seamAllowanceMm ?? 0;
    g(0, "BLOCK");
    g(8, "0");
    g(2, blocks[i]);
    g(70, "0");
    g(10, 0);
    g(20, 0);
    g(30, 0);
    g(3, blocks[i]);
    polyline(ASTM_LAYER.cutLine, allowance > 0 ? cutLineFromSewLine(sew, allowance) : sew);
    polyline(ASTM_LAYER.sewLine, sew);
    if (panel.grainline) line(ASTM_LAYER.grainLine, panel.grainline[0], panel.grainline[1]);
    const ccw = signedArea(sew) > 0;
    for (const notch of panel.notches ?? []) {
      const n = sew.length;
      const a = sew[((notch.edge % n) + n) % n];
      const b = sew[(((notch.edge + 1) % n) + n) % n];
      const len = Math.hypot(b[0] - a[0], b[1] - a[1]) || 1;
      // Outward normal: right of the edge direction for a counter-clockwise outline.
      const s = ccw ? 1 : -1;
      const ox = (s * (b[1] - a[1])) / len;
      const oy = (-s * (b[0] - a[0])) / len;
      const p = notch.point;
      // From the cut line in to the sew line, the way the notch is snipped; inward when there is no allowance.
      if (allowance > 0) line(ASTM_LAYER.notches, [p[0] + ox * allowance, p[1] + oy * allowance], p);
      else line(ASTM_LAYER.notches, p, [p[0] - ox * NOTCH_DEPTH_MM, p[1] - oy * NOTCH_DEPTH_MM]);
    }
    // Texts stacked from a point inside the piece (the block holds this one piece, so readers that go by
    // block find them wherever they fall).
    const at = interiorPoint(sew, 0);
    const below = (k: number): Point => [at[0], at[1] - k * 1.5 * TEXT_HEIGHT_MM];
    text(ASTM_LAYER.cutLine, below(0), `${ASTM_TEXT_LABEL.pieceName}: ${panel.name}`);
    text(ASTM_LAYER.cutLine, below(1), `${ASTM_TEXT_LABEL.quantity}: ${panel.cutCount}`);
    if (panel.mirrored) text(ASTM_LAYER.annotation, below(2), `${ASTM_TEXT_LABEL.annotation}: ${MIRRORED_ANNOTATION}`);
    g(0, "ENDBLK");
    g(8, "0");
  });
  g(0, "ENDSEC");

  g(0, "SECTION");
  g(2, "ENTITIES");
  for (const name of blocks) {
    g(0, "INSERT");
    g(8, "0");
    g(2, name);
    g(10, 0);
    g(20, 0);
    g(30, 0);
  }
  g(0, "ENDSEC");
  g(0, "EOF");
  return out.join("\n") + "\n";
}

/** One piece as its own DXF file. */
export function panelToDxf(panel: PanelShape): string {
  return panelsToDxf([panel]);
}
