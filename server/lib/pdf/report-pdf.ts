// Shared layout for printed reports (continuity books, rack lists): paper size from the production's
// setting, the app's own font (Merriweather Sans, shipped with the client), running headers and
// footers with page numbers, and a backpressure wait so a slow reader does not make the document
// pile up in memory.
import { createRequire } from "node:module";
import path from "node:path";
import PDFDocument from "pdfkit";
import type { PaperSize } from "@shared/schemas/productions.js";
import { dayLabel } from "@shared/domain/reports/day-label.js";

export const MM = 72 / 25.4; // PDF points per millimetre

/** The app's colours (design: ink-indigo structure, madder blocking, ochre warnings, slate notes). */
export const colours = {
  ink: "#2B3A67",
  madder: "#B5452E",
  ochre: "#C98B2B",
  slate: "#5B6770",
  chalk: "#F7F4EE",
  rule: "#D9D4CA",
  text: "#1E2236",
} as const;

/** Page sizes in points: ISO 216 A4 (210 × 297 mm) and US Letter (8.5 × 11 in). */
export const pageSizes: Record<PaperSize, { width: number; height: number }> = {
  A4: { width: 210 * MM, height: 297 * MM },
  Letter: { width: 8.5 * 72, height: 11 * 72 },
};

const fontDir = path.join(path.dirname(createRequire(import.meta.url).resolve("@fontsource/merriweather-sans/package.json")), "files");
export const fonts = {
  regular: path.join(fontDir, "merriweather-sans-latin-400-normal.woff"),
  bold: path.join(fontDir, "merriweather-sans-latin-700-normal.woff"),
};

/** Margins in points: room above and below for the running header and footer. */
export const margins = { top: 22 * MM, bottom: 18 * MM, left: 15 * MM, right: 15 * MM };

/**
 * A report document: chosen paper, our fonts registered as "Body" and "Bold", pages kept in memory
 * (their text only; images are written out as soon as they are placed) so running headers can say
 * "page n of N" at the end.
 */
export function createReportDocument(opts: { paperSize: PaperSize; title: string; subject?: string }): PDFKit.PDFDocument {
  const size = pageSizes[opts.paperSize];
  const doc = new PDFDocument({
    size: [size.width, size.height],
    margins,
    bufferPages: true,
    autoFirstPage: false,
    info: { Title: opts.title, Subject: opts.subject ?? "", Creator: "Seamscene", Producer: "Seamscene" },
  });
  doc.registerFont("Body", fonts.regular);
  doc.registerFont("Bold", fonts.bold);
  doc.font("Body");
  return doc;
}

/** Usable width between the margins. */
export function contentWidth(doc: PDFKit.PDFDocument): number {
  return doc.page.width - doc.page.margins.left - doc.page.margins.right;
}

/** Lowest y content may reach on this page. */
export function contentBottom(doc: PDFKit.PDFDocument): number {
  return doc.page.height - doc.page.margins.bottom;
}

/**
 * Writes the running header and footer on every buffered page: `left` and `right` at the top, a rule,
 * and "Page n of N" with `footer` at the bottom.
 */
export function stampPages(doc: PDFKit.PDFDocument, header: { left: string; right: string }, footer: string): void {
  const range = doc.bufferedPageRange();
  const total = range.count;
  for (let i = range.start; i < range.start + total; i++) {
    doc.switchToPage(i);
    const { width, height } = doc.page;
    const saved = { ...doc.page.margins };
    // Writing inside the margins would otherwise start a new page.
    doc.page.margins = { top: 0, bottom: 0, left: 0, right: 0 };
    const left = margins.left;
    const w = width - margins.left - margins.right;
    doc.font("Bold").fontSize(8.5).fillColor(colours.ink);
    oneLine(doc, header.left, left, 10 * MM, w * 0.62);
    doc.font("Body").fontSize(8.5).fillColor(colours.slate);
    oneLine(doc, header.right, left + w * 0.62, 10 * MM, w * 0.38, { align: "right" });
    doc
      .moveTo(left, 15 * MM)
      .lineTo(left + w, 15 * MM)
      .lineWidth(0.6)
      .strokeColor(colours.ink)
      .stroke();
    doc.font("Body").fontSize(7.5).fillColor(colours.slate);
    oneLine(doc, footer, left, height - 12 * MM, w * 0.7);
    doc
      .font("Bold")
      .fontSize(8)
      .fillColor(colours.ink)
      .text(`Page ${i - range.start + 1} of ${total}`, left + w * 0.7, height - 12 * MM, {
        width: w * 0.3,
        align: "right",
        lineBreak: false,
      });
    doc.page.margins = saved;
  }
}

/** `text` cut to fit `width` in the current font and size, with an ellipsis when cut. */
export function fitText(doc: PDFKit.PDFDocument, text: string, width: number): string {
  if (doc.widthOfString(text) <= width) return text;
  let lo = 0;
  let hi = text.length;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (doc.widthOfString(`${text.slice(0, mid).trimEnd()}…`) <= width) lo = mid;
    else hi = mid - 1;
  }
  return `${text.slice(0, lo).trimEnd()}…`;
}

/** Writes one line of text at (x, y), cut to `width` (never wraps onto the next line). */
export function oneLine(
  doc: PDFKit.PDFDocument,
  text: string,
  x: number,
  y: number,
  width: number,
  options: { align?: "left" | "right" | "center" } = {},
): void {
  doc.text(fitText(doc, text, width), x, y, { width, lineBreak: false, align: options.align ?? "left" });
}

/**
 * Resolves once the document's unread output is below `limitBytes` (the reader has caught up), or
 * at once when the reader has gone away (the caller then stops laying out pages).
 */
export async function waitForReader(
  doc: PDFKit.PDFDocument,
  out: NodeJS.WritableStream & { destroyed?: boolean },
  limitBytes = 2 * 1024 * 1024,
): Promise<void> {
  while (doc.readableLength > limitBytes && !doc.destroyed && !out.destroyed) await new Promise((r) => setTimeout(r, 5));
}

/** Short flag words for print. */
export function flagWords(f: { wet: boolean; stunt: boolean; blood: boolean; vfxShot: boolean }): string[] {
  return [f.wet && "WET", f.stunt && "STUNT", f.blood && "BLOOD", f.vfxShot && "EFFECTS SHOT"].filter((x): x is string => Boolean(x));
}

/** A calendar day as "Tue 8 Dec 2026" (the shared report wording). */
export const printDate = dayLabel;
