// Printable tag labels: an A4 sheet of 3 × 8 labels (70 × 37 mm, a common adhesive-label layout),
// each with a QR code holding only the tag code (so any scanner "types" it) and the code in text.
import PDFDocument from "pdfkit";
import QRCode from "qrcode";

const MM = 72 / 25.4; // PDF points per millimetre
const PAGE = { w: 210 * MM, h: 297 * MM };
const COLS = 3;
const ROWS = 8;
const LABEL = { w: 70 * MM, h: 37 * MM };
const TOP = (PAGE.h - ROWS * LABEL.h) / 2;

/** Labels on one sheet. */
export const LABELS_PER_SHEET = COLS * ROWS;

/**
 * Top-left corner of a label slot in PDF points from the page's top left (slot 0 = top left, row by row).
 * Exported so tests can check where a label landed.
 */
export function labelSlotOrigin(slot: number): { x: number; y: number } {
  return { x: (slot % COLS) * LABEL.w, y: TOP + Math.floor(slot / COLS) * LABEL.h };
}

/** What one label shows. */
export interface TagLabel {
  tagCode: string;
  name: string;
  /** Second line: size, copy number, category. */
  detail: string;
}

/** Draws a QR code as vector squares (sharp at any printer resolution). */
export function drawQr(doc: PDFKit.PDFDocument, text: string, x: number, y: number, size: number) {
  // Medium error correction survives a crease or a wash-faded corner on a sewn-in label.
  const qr = QRCode.create(text, { errorCorrectionLevel: "M" });
  const n = qr.modules.size;
  const quiet = 2; // modules of white border
  const cell = size / (n + quiet * 2);
  doc.save().fillColor("black");
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < n; c++) {
      if (qr.modules.get(r, c)) doc.rect(x + (c + quiet) * cell, y + (r + quiet) * cell, cell, cell);
    }
  }
  doc.fill().restore();
}

/** Options for a label sheet. */
export interface TagLabelOptions {
  /** First free position on a partly used sheet, 1..24 (1 = top left, counting along each row); default 1. */
  start?: number;
}

/**
 * Renders tag labels as a PDF.
 * @param productionTitle printed small on each label so a stray garment finds its way home
 * @param options.start the first position to print on (the labels before it are already used)
 * @returns the PDF bytes
 */
export function renderTagLabelsPdf(labels: TagLabel[], productionTitle: string, options: TagLabelOptions = {}): Promise<Buffer> {
  const skip = Math.min(LABELS_PER_SHEET - 1, Math.max(0, Math.floor((options.start ?? 1) - 1)));
  const doc = new PDFDocument({ size: "A4", margin: 0, info: { Title: `Tag labels — ${productionTitle}`, Creator: "Seamscene" } });
  const chunks: Buffer[] = [];
  doc.on("data", (c: Buffer) => chunks.push(c));
  const done = new Promise<Buffer>((resolve, reject) => {
    doc.on("end", () => resolve(Buffer.concat(chunks)));
    doc.on("error", reject);
  });
  if (labels.length === 0) {
    doc
      .font("Helvetica")
      .fontSize(12)
      .text("No garments matched the chosen filters.", 20 * MM, 20 * MM);
  }
  labels.forEach((label, n) => {
    // Used positions on the first sheet are skipped; later sheets start at the top left.
    const i = n + skip;
    const slot = i % LABELS_PER_SHEET;
    if (n > 0 && slot === 0) doc.addPage();
    const { x, y } = labelSlotOrigin(slot);
    const qrSize = 31 * MM;
    drawQr(doc, label.tagCode, x + 3 * MM, y + 3 * MM, qrSize);
    const tx = x + 3 * MM + qrSize + 2 * MM;
    const tw = LABEL.w - (tx - x) - 3 * MM;
    doc
      .fillColor("black")
      .font("Courier-Bold")
      .fontSize(15)
      .text(label.tagCode, tx, y + 6 * MM, { width: tw, lineBreak: false });
    doc
      .font("Helvetica-Bold")
      .fontSize(8)
      .text(label.name, tx, y + 14 * MM, { width: tw, height: 9 * MM, ellipsis: true });
    doc
      .font("Helvetica")
      .fontSize(7)
      .text(label.detail, tx, y + 24 * MM, { width: tw, height: 5 * MM, ellipsis: true });
    doc
      .fillColor("#5B6770")
      .fontSize(6)
      .text(productionTitle, tx, y + 30 * MM, { width: tw, lineBreak: false, ellipsis: true });
  });
  doc.end();
  return done;
}
