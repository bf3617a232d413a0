// The rack list as printed for the rack: per character in call order, each garment with a QR code that
// opens check-out on a phone, tag code, copy, rack and bin, status, flags and warnings, and a box to tick.
import type { Writable } from "node:stream";
import type { PaperSize } from "@shared/schemas/productions.js";
import type { RackListDto } from "@shared/schemas/reports.js";
import { garmentStatusLabels } from "@shared/schemas/garments.js";
import { rackFlags } from "@shared/domain/reports/rack-list.js";
import { drawQr } from "../tag-labels.js";
import {
  colours,
  contentBottom,
  contentWidth,
  createReportDocument,
  MM,
  oneLine,
  printDate,
  stampPages,
  waitForReader,
} from "./report-pdf.js";

const QR = 20 * MM;
const ROW = QR + 3 * MM;

/** "Shoot day 7 · Tue 8 Dec 2026 · call 07:00" or "Performance · …". */
export function rackDayTitle(list: RackListDto): string {
  if (!list.day) return list.productionKind === "stage" ? "No performance after today" : "No shoot day after today";
  const d = list.day;
  return `${d.kind === "performance" ? "Performance" : `Shoot day ${d.dayNumber}`} · ${printDate(d.date)}${d.startsAt ? ` · ${d.startsAt}` : ""}`;
}

/**
 * Renders the rack list into `out`.
 * @param qrUrl turns a garment's check-out path into the full address its QR code holds
 */
export async function renderRackListPdf(
  list: RackListDto,
  out: Writable,
  opts: { paperSize: PaperSize; productionTitle: string; qrUrl: (path: string) => string },
): Promise<{ pages: number }> {
  const doc = createReportDocument({
    paperSize: opts.paperSize,
    title: `Rack list - ${rackDayTitle(list)}`,
    subject: opts.productionTitle,
  });
  const finished = new Promise<void>((resolve, reject) => {
    out.on("finish", resolve);
    out.on("close", resolve);
    out.on("error", reject);
    doc.on("error", reject);
  });
  doc.pipe(out);
  doc.addPage();
  const width = contentWidth(doc);
  const left = doc.page.margins.left;

  doc
    .fillColor(colours.ink)
    .font("Bold")
    .fontSize(18)
    .text(list.productionKind === "stage" ? "Rack list for the next performance" : "Rack list for the next shoot day", left, doc.y, {
      width,
    });
  doc.font("Bold").fontSize(12).text(rackDayTitle(list), { width });
  doc
    .fillColor(colours.slate)
    .font("Body")
    .fontSize(9)
    .text(
      `Printed ${printDate(list.today)} · ${list.counts.characters} character${list.counts.characters === 1 ? "" : "s"} in call order · ${list.counts.garments} garment${list.counts.garments === 1 ? "" : "s"} · ${list.counts.warnings} warning${list.counts.warnings === 1 ? "" : "s"}. Scan a code with a phone to open check-out for that garment.`,
      { width },
    );
  if (list.day?.notes) doc.fillColor(colours.text).fontSize(9).text(list.day.notes, { width });
  if (list.characters.some((c) => c.changes.some((ch) => ch.garments.some((g) => g.wet || g.stunt)))) {
    doc
      .moveDown(0.3)
      .fillColor(colours.ochre)
      .font("Bold")
      .fontSize(8.5)
      .text(
        "Wet and stunt scenes: bring the spare copy; agree drying, padding and quick-release fastenings with the stunt coordinator and follow local safety rules.",
        { width },
      );
  }
  doc.moveDown(0.6);

  const cols = {
    qr: 0,
    tag: QR + 3 * MM,
    garment: QR + 3 * MM + width * 0.15,
    where: QR + 3 * MM + width * 0.42,
    status: QR + 3 * MM + width * 0.52,
    tick: width - 6 * MM,
  };
  const ensure = (h: number) => {
    if (doc.y + h > contentBottom(doc)) doc.addPage();
  };
  if (!list.characters.length)
    doc
      .fillColor(colours.text)
      .font("Body")
      .fontSize(10)
      .text(list.day ? "Nobody is called on this day." : "Nothing is scheduled after today.", left, doc.y, { width });

  for (const c of list.characters) {
    ensure(18 + ROW);
    const top = doc.y;
    doc.rect(left, top, width, 16).fill(colours.chalk);
    doc.fillColor(colours.ink).font("Bold").fontSize(11);
    oneLine(doc, `${c.callOrder}. ${c.name}`, left + 4, top + 3, width * 0.55);
    doc.fillColor(colours.slate).font("Body").fontSize(8.5);
    oneLine(doc, `Scenes ${c.sceneNumbers.join(", ")}`, left + width * 0.55, top + 4, width * 0.45 - 4, { align: "right" });
    doc.y = top + 19;
    for (const ch of c.changes) {
      ensure(12 + ROW);
      doc
        .fillColor(colours.ink)
        .font("Bold")
        .fontSize(9)
        .text(
          `${ch.number !== null ? `Change ${ch.number}` : "No change set"}${ch.description ? ` – ${ch.description}` : ""} · scenes ${ch.sceneNumbers.join(", ")}`,
          left,
          doc.y,
          { width },
        );
      doc.y += 2;
      for (const g of ch.garments) {
        ensure(ROW);
        const y = doc.y;
        if (g.checkOutPath) drawQr(doc, opts.qrUrl(g.checkOutPath), left + cols.qr, y, QR);
        else
          doc
            .rect(left, y + 2, QR - 4, QR - 4)
            .lineWidth(0.5)
            .strokeColor(colours.rule)
            .stroke();
        doc
          .fillColor(colours.text)
          .font("Bold")
          .fontSize(10)
          .text(g.tagCode ?? "no tag", left + cols.tag, y + 3, { width: cols.garment - cols.tag - 4, lineBreak: false });
        if (g.copyNumber !== null)
          doc
            .font("Bold")
            .fontSize(9)
            .fillColor(colours.ink)
            .text(`copy #${g.copyNumber}${g.copiesHeld !== null ? ` of ${g.copiesHeld}` : ""}`, left + cols.tag, y + 16, {
              width: cols.garment - cols.tag - 4,
              lineBreak: false,
            });
        doc
          .fillColor(colours.text)
          .font("Body")
          .fontSize(9)
          .text(`${g.label}: ${g.name ?? "—"}`, left + cols.garment, y + 3, {
            width: cols.where - cols.garment - 4,
            height: 22,
            ellipsis: true,
          });
        const flags = rackFlags(g);
        const extra = [
          `stage ${g.distressStage}`,
          ...flags,
          g.bringSpare
            ? g.spare
              ? `bring spare copy ${g.spare.tagCode}${g.spare.copyNumber ? ` (#${g.spare.copyNumber})` : ""}`
              : "bring spare copy (none held)"
            : null,
          g.sceneNumbers.length ? `sc ${g.sceneNumbers.join(", ")}` : null,
        ].filter(Boolean);
        doc
          .fillColor(flags.length ? colours.madder : colours.slate)
          .font(flags.length ? "Bold" : "Body")
          .fontSize(7.5)
          .text(extra.join(" · "), left + cols.garment, y + 27, { width: cols.where - cols.garment - 4, height: 20, ellipsis: true });
        doc
          .fillColor(colours.text)
          .font("Bold")
          .fontSize(9)
          .text(`Rack ${g.rack ?? "–"}`, left + cols.where, y + 3, { width: cols.status - cols.where - 4, lineBreak: false });
        doc
          .font("Body")
          .fontSize(9)
          .text(`Bin ${g.bin ?? "–"}`, left + cols.where, y + 16, { width: cols.status - cols.where - 4, lineBreak: false });
        doc
          .fillColor(g.status === "in_stock" ? colours.text : colours.madder)
          .font("Bold")
          .fontSize(8.5)
          .text(g.status ? garmentStatusLabels[g.status] : "—", left + cols.status, y + 3, {
            width: cols.tick - cols.status - 4,
            lineBreak: false,
          });
        if (g.warnings.length) {
          doc
            .fillColor(colours.madder)
            .font("Body")
            .fontSize(7.5)
            .text(g.warnings.map((w) => `! ${w.message}`).join("\n"), left + cols.status, y + 15, {
              width: cols.tick - cols.status - 4,
              height: ROW - 16,
              ellipsis: true,
            });
        }
        doc
          .rect(left + cols.tick, y + 3, 5 * MM, 5 * MM)
          .lineWidth(0.8)
          .strokeColor(colours.ink)
          .stroke();
        doc
          .moveTo(left + cols.tag, y + ROW - 1.5 * MM)
          .lineTo(left + width, y + ROW - 1.5 * MM)
          .lineWidth(0.3)
          .strokeColor(colours.rule)
          .stroke();
        doc.y = y + ROW;
      }
      doc.y += 3;
    }
    doc.y += 4;
    await waitForReader(doc, out);
    // The reader went away (a closed browser tab): stop laying out pages nobody will read.
    if (out.destroyed) break;
  }
  stampPages(
    doc,
    { left: `${opts.productionTitle} · Rack list`, right: rackDayTitle(list) },
    "Tick each garment as it goes on the rack; check it out by scanning its code.",
  );
  const pages = doc.bufferedPageRange().count;
  doc.end();
  await finished;
  return { pages };
}
