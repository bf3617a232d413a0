// summary.pdf of a handoff packet (pdfkit, built-in Helvetica, A4): what the packet holds, with every
// figure printed by the one number formatter (grouped thousands, stated precision, unit). The
// precisions are exported so a test can check each printed figure against the JSON files.
import PDFDocument from "pdfkit";
import type { PacketContents } from "@shared/schemas/packets.js";
import { formatQuantity, type Precision } from "@shared/domain/number-format.js";
import type { TaggedValue } from "@shared/domain/fabric-physics.js";

/** Who and when, for the manifest and summary. */
export interface PacketBuildMeta {
  packetId: string;
  version: number;
  publishedAt: Date;
  publishedByName: string;
}

/** Units and precision of each printed figure (value in the JSON files × factor = printed value). */
export const SUMMARY_FIGURES = {
  /** panels.json areaMm2 ÷ 100. */
  panelArea: { unit: "cm²", factor: 1 / 100, precision: { decimals: 1 } },
  /** panels.json seamAllowanceMm. */
  seamAllowance: { unit: "mm", factor: 1, precision: { decimals: 1 } },
  /** fabrics.json massPerArea (kg/m²) × 1000. */
  massPerArea: { unit: "g/m²", factor: 1000, precision: { significant: 3 } },
  /** fabrics.json bendingStiffness (N·m) × 10⁶. */
  bendingStiffness: { unit: "µN·m", factor: 1e6, precision: { significant: 3 } },
  /** fabrics.json stretchStiffness (N/m). */
  stretchStiffness: { unit: "N/m", factor: 1, precision: { significant: 3 } },
  /** fabrics.json thickness (m) × 1000. */
  thickness: { unit: "mm", factor: 1000, precision: { significant: 3 } },
  /** fabrics.json shearStiffness (N/m/rad). */
  shearStiffness: { unit: "N/m/rad", factor: 1, precision: { significant: 3 } },
  /** fabrics.json friction (coefficient). */
  friction: { unit: "", factor: 1, precision: { decimals: 2 } },
} as const satisfies Record<string, { unit: string; factor: number; precision: Precision }>;

type Figure = keyof typeof SUMMARY_FIGURES;
const fig = (kind: Figure, value: number) => {
  const f = SUMMARY_FIGURES[kind];
  return formatQuantity(value * f.factor, f.unit, f.precision);
};
/** M = measured, A = assumed (a class default). */
const basis = (v: { basis: string }) => (v.basis === "measured" ? "M" : "A");
const tagged = (kind: Figure, v: TaggedValue<string>) => `${fig(kind, v.value)} (${basis(v)})`;

/** The packet summary as a PDF; the same contents, meta and title give the same bytes. */
export async function summaryPdf(contents: PacketContents, meta: PacketBuildMeta, productionTitle: string): Promise<Buffer> {
  const doc = new PDFDocument({
    size: "A4",
    margin: 42,
    info: { Title: `Handoff packet v${meta.version}`, Author: "Seamscene", CreationDate: meta.publishedAt, ModDate: meta.publishedAt },
  });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<void>((resolve) => doc.on("end", () => resolve()));
  const width = doc.page.width - 84;
  const line = (text: string, opts: { size?: number; bold?: boolean; gap?: number; indent?: number } = {}) => {
    doc
      .font(opts.bold ? "Helvetica-Bold" : "Helvetica")
      .fontSize(opts.size ?? 9)
      .text(text, doc.page.margins.left + (opts.indent ?? 0), undefined, { width: width - (opts.indent ?? 0) });
    if (opts.gap) doc.moveDown(opts.gap);
  };

  line(`Handoff packet: ${contents.character.name}, change ${contents.change.number}`, { size: 16, bold: true, gap: 0.2 });
  line(
    `${productionTitle} · version ${meta.version} · published ${meta.publishedAt.toISOString().slice(0, 10)} by ${meta.publishedByName}`,
    { size: 10, gap: 0.6 },
  );
  if (contents.change.description) line(contents.change.description, { gap: 0.5 });

  line("Garments and panels (sew-line area; cut line = sew line + seam allowance)", { size: 11, bold: true, gap: 0.2 });
  for (const g of contents.garments) {
    const ps = contents.panels.filter((p) => p.garmentId === g.id);
    line(`${g.name} (${g.tagCode})${ps.length ? "" : ": no panels"}`, { bold: true });
    for (const p of ps) {
      line(
        `• ${p.name}: cut ${p.cutCount}${p.mirrored ? " (mirrored pairs)" : ""}; area ${fig("panelArea", p.areaMm2)}; seam allowance ${fig("seamAllowance", p.seamAllowanceMm)}`,
        { indent: 10 },
      );
    }
  }
  doc.moveDown(0.3);
  const mismatched = contents.seams.filter((s) => s.status === "mismatch" || s.status === "eased_out_of_range");
  line(`Seams: ${contents.seams.length}, ${mismatched.length ? `${mismatched.length} outside tolerance` : "all within tolerance"}`, {
    gap: 0.5,
  });

  line("Fabrics (M = measured, A = assumed class default)", { size: 11, bold: true, gap: 0.2 });
  for (const f of contents.fabrics) {
    const s = f.simulation;
    line(f.name, { bold: true });
    line(`• mass per area ${tagged("massPerArea", s.massPerArea)}; thickness ${tagged("thickness", s.thickness)}`, { indent: 10 });
    line(
      `• bending stiffness warp ${tagged("bendingStiffness", s.bendingStiffness.warp)}, weft ${tagged("bendingStiffness", s.bendingStiffness.weft)}`,
      { indent: 10 },
    );
    line(
      `• stretch stiffness warp ${tagged("stretchStiffness", s.stretchStiffness.warp)}, weft ${tagged("stretchStiffness", s.stretchStiffness.weft)}`,
      { indent: 10 },
    );
    if (s.shearStiffness || s.friction) {
      const parts = [
        s.shearStiffness && `shear stiffness ${tagged("shearStiffness", s.shearStiffness)}`,
        s.friction && `friction ${tagged("friction", s.friction)}`,
      ].filter(Boolean);
      line(`• ${parts.join("; ")}`, { indent: 10 });
    }
  }
  doc.moveDown(0.4);

  line("Effects shots (distress stage)", { size: 11, bold: true, gap: 0.2 });
  if (!contents.shots.length) line("None chosen.");
  for (const s of contents.shots) {
    line(
      `• Scene ${s.sceneNumber}${s.storyDay ? ` (story day ${s.storyDay})` : ""}: distress ${s.distressStage}${s.wet ? ", wet" : ""}${s.blood ? ", blood" : ""}${s.stunt ? ", stunt" : ""}${s.photoFiles.length ? `, ${s.photoFiles.length} photo(s)` : ""}`,
      { indent: 10 },
    );
  }
  doc.moveDown(0.4);
  line(
    `Reference photos: ${contents.photos.length}. Performer measurements: ${contents.measurements ? "included (personal data: keep confidential, delete when the work ends)" : "not included"}.`,
    { gap: 0.4 },
  );
  if (contents.notes) line(`Notes: ${contents.notes}`, { gap: 0.4 });
  line(
    "Check the files with: sha256sum -c SHA256SUMS. Physics in SI (this page prints bending in µN·m and mass in g/m²); pattern files (panels.json, .svg, .dxf) in millimetres.",
    { size: 8 },
  );
  doc.end();
  await done;
  return Buffer.concat(chunks);
}
