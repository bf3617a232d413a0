// The continuity book: one character's scenes in story order, each with its shoot day, change,
// garments (tag codes and copy numbers), distress stage, flags, notes and photos by view. A contents
// page comes first; every page carries production, character and "page n of N".
//
// Memory stays bounded: photos are fetched and re-encoded a few scenes ahead of the page being laid
// out, placed, then dropped (pdfkit writes an image out as soon as it is placed), and the writer waits
// when the reader falls behind.
import type { Writable } from "node:stream";
import type { PhotoView } from "@shared/schemas/photos.js";
import type { PaperSize } from "@shared/schemas/productions.js";
import { toPrintJpeg } from "../images.js";
import {
  colours,
  contentBottom,
  contentWidth,
  createReportDocument,
  flagWords,
  MM,
  oneLine,
  printDate,
  stampPages,
  waitForReader,
} from "./report-pdf.js";

export interface BookPhoto {
  id: string;
  view: PhotoView;
  caption: string | null;
  /** Storage key of the size to print (thumbnail or display; never the original). */
  key: string;
}

export interface BookGarment {
  tagCode: string;
  name: string;
  copyNumber: number | null;
  copiesHeld: number | null;
}

export interface BookScene {
  number: string;
  storyDay: number | null;
  setName: string | null;
  intExt: string | null;
  timeOfDay: string | null;
  shootDays: Array<{ date: string; dayNumber: number; kind: "shoot" | "performance" }>;
  change: { number: number; description: string | null } | null;
  /** Distress stage the breakdown asks for. */
  distressStage: number;
  /** Stage logged on set, when logged. */
  loggedStage: number | null;
  flags: { wet: boolean; stunt: boolean; blood: boolean; vfxShot: boolean };
  garments: BookGarment[];
  /** True when no one has logged what was worn yet, so the garments are the change's plan. */
  garmentsPlanned: boolean;
  notes: string[];
  photos: BookPhoto[];
}

export interface BookModel {
  productionTitle: string;
  /** Stage: scenes play in every performance (no shoot days). */
  stage: boolean;
  characterName: string;
  /** "Change 3 – Sunday best" for a book of one change; null for the whole character. */
  changeLabel: string | null;
  printedOn: string;
  paperSize: PaperSize;
  scenes: BookScene[];
}

export interface BookRenderOptions {
  /** Reads a stored photo file. */
  loadPhoto: (key: string) => Promise<Buffer>;
  /** Longest edge of a printed photo in pixels (thumbnails are 320 px already). */
  maxPhotoPx: number;
  /** Scenes whose photos are fetched ahead of the one being laid out. */
  prefetchScenes?: number;
}

export interface BookRenderResult {
  pages: number;
  /** Photos placed on each page (index 0 = page 1). */
  imagesPerPage: number[];
}

const VIEW_ORDER: PhotoView[] = ["front", "back", "left", "right", "detail", "other"];
export const viewLabels: Record<PhotoView, string> = {
  front: "Front",
  back: "Back",
  left: "Left side",
  right: "Right side",
  detail: "Detail",
  other: "Other",
};

/** Photos ordered by view (front, back, sides, detail), then as logged. */
export function photosByView(photos: BookPhoto[]): BookPhoto[] {
  return photos
    .map((p, i) => ({ p, i }))
    .sort((a, b) => VIEW_ORDER.indexOf(a.p.view) - VIEW_ORDER.indexOf(b.p.view) || a.i - b.i)
    .map((x) => x.p);
}

/** "EA-7K2Q Keeper's jacket #2 of 3". */
export function garmentLine(g: BookGarment): string {
  const copy = g.copyNumber ? ` #${g.copyNumber}${g.copiesHeld ? ` of ${g.copiesHeld}` : ""}` : "";
  return `${g.tagCode}  ${g.name}${copy}`;
}

/** "Shoot day 7, Tue 8 Dec 2026" (or "Performance, …"; several joined). */
export function shootDayLabel(s: BookScene, stage: boolean): string {
  if (!s.shootDays.length) return stage ? "Every performance (running order)" : "Not scheduled";
  return s.shootDays
    .map((d) => `${d.kind === "performance" ? "Performance" : `Shoot day ${d.dayNumber}`}, ${printDate(d.date)}`)
    .join("; ");
}

type Loaded = { photo: BookPhoto; jpeg: { body: Buffer; width: number; height: number } | null };

const COLS = 4;
const GAP = 4 * MM;
const CONTENTS_ROW = 15;

/**
 * Renders a continuity book into `out` (an HTTP response, a file, a ZIP entry).
 * @returns page count and photos per page, once the last byte is written
 */
export async function renderContinuityBook(model: BookModel, out: Writable, opts: BookRenderOptions): Promise<BookRenderResult> {
  const doc = createReportDocument({
    paperSize: model.paperSize,
    title: `Continuity book - ${model.characterName}`,
    subject: model.productionTitle,
  });
  const finished = new Promise<void>((resolve, reject) => {
    out.on("finish", resolve);
    out.on("close", resolve);
    out.on("error", reject);
    doc.on("error", reject);
  });
  doc.pipe(out);

  const imagesPerPage: number[] = [];
  const placeImage = () => {
    const n = doc.bufferedPageRange().start + doc.bufferedPageRange().count - 1;
    imagesPerPage[n] = (imagesPerPage[n] ?? 0) + 1;
  };
  const addPage = () => {
    doc.addPage();
    const n = doc.bufferedPageRange().count - 1;
    imagesPerPage[n] ??= 0;
  };

  // Contents pages are reserved first; their rows are written once page numbers are known.
  addPage();
  const width = contentWidth(doc);
  const left = doc.page.margins.left;
  const titleBlock = 120;
  const rowsFirst = Math.max(1, Math.floor((contentBottom(doc) - doc.page.margins.top - titleBlock - 20) / CONTENTS_ROW));
  const rowsNext = Math.floor((contentBottom(doc) - doc.page.margins.top - 20) / CONTENTS_ROW);
  const contentsPages = model.scenes.length <= rowsFirst ? 1 : 1 + Math.ceil((model.scenes.length - rowsFirst) / rowsNext);
  for (let i = 1; i < contentsPages; i++) addPage();

  // Photos for scene i are fetched while earlier scenes are laid out, a few scenes ahead.
  const ahead = Math.max(0, opts.prefetchScenes ?? 2);
  const pending = new Map<number, Promise<Loaded[]>>();
  const load = (i: number): Promise<Loaded[]> => {
    const s = model.scenes[i];
    if (!s) return Promise.resolve([]);
    let p = pending.get(i);
    if (!p) {
      p = Promise.all(
        photosByView(s.photos).map(async (photo): Promise<Loaded> => {
          try {
            return { photo, jpeg: await toPrintJpeg(await opts.loadPhoto(photo.key), opts.maxPhotoPx) };
          } catch {
            // A missing or unreadable file prints as an empty frame rather than failing the book.
            return { photo, jpeg: null };
          }
        }),
      );
      // Rejections are handled where the promise is awaited.
      p.catch(() => undefined);
      pending.set(i, p);
    }
    return p;
  };

  const scenePage: number[] = [];
  const photoW = (width - GAP * (COLS - 1)) / COLS;
  const photoH = photoW * (4 / 3);
  const rowH = photoH + 14;

  for (let i = 0; i < model.scenes.length; i++) {
    for (let k = i; k <= i + ahead && k < model.scenes.length; k++) void load(k);
    const s = model.scenes[i]!;
    const loaded = await load(i);
    pending.delete(i);

    // Measure the text part so a scene's heading never sits alone at the foot of a page.
    const lines = sceneTextLines(s, model.stage);
    doc.font("Body").fontSize(9);
    let textH = 22;
    for (const l of lines)
      textH +=
        doc
          .font(l.bold ? "Bold" : "Body")
          .fontSize(l.size ?? 9)
          .heightOfString(l.text, { width }) + 2;
    const firstRow = loaded.length ? rowH : 0;
    if (i === 0 || doc.y + textH + firstRow > contentBottom(doc)) addPage();
    else doc.y += 8;
    scenePage[i] = doc.bufferedPageRange().count;

    const top = doc.y;
    doc.rect(left, top, width, 18).fill(colours.chalk);
    doc
      .fillColor(colours.ink)
      .font("Bold")
      .fontSize(11)
      .text(`Scene ${s.number}`, left + 4, top + 4, { width: width * 0.3, lineBreak: false });
    const where = [s.intExt, s.setName, s.timeOfDay].filter(Boolean).join(" · ");
    doc.fillColor(colours.slate).font("Body").fontSize(8.5);
    oneLine(
      doc,
      `${s.storyDay != null ? `Story day ${s.storyDay}` : "No story day"}${where ? ` · ${where}` : ""}`,
      left + width * 0.3,
      top + 5,
      width * 0.7 - 4,
      { align: "right" },
    );
    doc.y = top + 22;
    for (const l of lines) {
      doc
        .fillColor(l.colour ?? colours.text)
        .font(l.bold ? "Bold" : "Body")
        .fontSize(l.size ?? 9)
        .text(l.text, left, doc.y, { width });
      doc.y += 2;
    }

    // Photos, four to a row; a row that does not fit goes to the next page.
    for (let r = 0; r * COLS < loaded.length; r++) {
      if (doc.y + rowH > contentBottom(doc)) {
        addPage();
        doc.fillColor(colours.slate).font("Body").fontSize(8).text(`Scene ${s.number}, continued`, left, doc.y);
        doc.y += 4;
      }
      const y = doc.y + 2;
      loaded.slice(r * COLS, r * COLS + COLS).forEach((item, c) => {
        const x = left + c * (photoW + GAP);
        if (item.jpeg) {
          doc.image(item.jpeg.body, x, y, { fit: [photoW, photoH], align: "center", valign: "center" });
          placeImage();
        } else {
          doc.rect(x, y, photoW, photoH).lineWidth(0.5).strokeColor(colours.rule).stroke();
          doc
            .fillColor(colours.slate)
            .font("Body")
            .fontSize(7)
            .text("Photo file missing", x, y + photoH / 2 - 4, { width: photoW, align: "center", lineBreak: false });
        }
        // Drop the bytes as soon as they are in the document.
        item.jpeg = null;
        const caption = viewLabels[item.photo.view] + (item.photo.caption ? ` · ${item.photo.caption}` : "");
        doc.fillColor(colours.ink).font("Bold").fontSize(7);
        oneLine(doc, caption, x, y + photoH + 2, photoW);
      });
      doc.y = y + rowH;
    }
    doc
      .moveTo(left, doc.y + 2)
      .lineTo(left + width, doc.y + 2)
      .lineWidth(0.4)
      .strokeColor(colours.rule)
      .stroke();
    doc.y += 4;
    await waitForReader(doc, out);
    // The reader went away (a closed browser tab): stop laying out pages nobody will read.
    if (out.destroyed) break;
  }

  // Contents, now that every scene's page is known.
  doc.switchToPage(0);
  let y = doc.page.margins.top;
  doc.fillColor(colours.ink).font("Bold").fontSize(20).text("Continuity book", left, y, { width });
  y = doc.y + 2;
  doc.font("Bold").fontSize(14).text(model.characterName, left, y, { width });
  y = doc.y + 2;
  doc
    .fillColor(colours.slate)
    .font("Body")
    .fontSize(9.5)
    .text(
      [
        model.productionTitle,
        model.changeLabel,
        `${model.scenes.length} scene${model.scenes.length === 1 ? "" : "s"} in story order`,
        `printed ${printDate(model.printedOn)}`,
      ]
        .filter(Boolean)
        .join(" · "),
      left,
      y,
      { width },
    );
  y = Math.max(doc.y + 8, doc.page.margins.top + titleBlock - 24);
  if (!model.scenes.length)
    doc
      .fillColor(colours.text)
      .font("Body")
      .fontSize(10)
      .text("This character plays in no scene yet.", left, y + 4, { width });
  const cols = [
    { label: "Scene", x: 0, w: 0.12 },
    { label: "Story day", x: 0.12, w: 0.11 },
    { label: "Shoot day", x: 0.23, w: 0.35 },
    { label: "Change", x: 0.58, w: 0.32 },
    { label: "Page", x: 0.9, w: 0.1 },
  ];
  const header = (yy: number) => {
    doc.fillColor(colours.ink).font("Bold").fontSize(8.5);
    for (const c of cols)
      doc.text(c.label, left + c.x * width, yy, { width: c.w * width - 4, align: c.label === "Page" ? "right" : "left", lineBreak: false });
    doc
      .moveTo(left, yy + 12)
      .lineTo(left + width, yy + 12)
      .lineWidth(0.6)
      .strokeColor(colours.ink)
      .stroke();
    return yy + 16;
  };
  let page = 0;
  let rowsLeft = rowsFirst;
  if (model.scenes.length) y = header(y);
  model.scenes.forEach((s, i) => {
    if (rowsLeft === 0) {
      page++;
      doc.switchToPage(page);
      y = header(doc.page.margins.top);
      rowsLeft = rowsNext;
    }
    const cells = [
      s.number,
      s.storyDay != null ? String(s.storyDay) : "–",
      s.shootDays.length
        ? s.shootDays.map((d) => (d.kind === "performance" ? printDate(d.date) : `${d.dayNumber} · ${printDate(d.date)}`)).join("; ")
        : model.stage
          ? "every performance"
          : "not scheduled",
      s.change ? `${s.change.number}${s.change.description ? ` ${s.change.description}` : ""}` : "–",
      String(scenePage[i] ?? ""),
    ];
    doc.fillColor(colours.text).font("Body").fontSize(8.5);
    cols.forEach((c, k) =>
      oneLine(doc, cells[k]!, left + c.x * width, y, c.w * width - 4, { align: c.label === "Page" ? "right" : "left" }),
    );
    y += CONTENTS_ROW;
    rowsLeft--;
  });

  stampPages(
    doc,
    { left: `${model.productionTitle} · ${model.characterName}`, right: model.changeLabel ?? "Continuity book" },
    "Continuity book · no measurements or personal data are printed",
  );
  const pages = doc.bufferedPageRange().count;
  doc.end();
  await finished;
  return { pages, imagesPerPage: Array.from({ length: pages }, (_, i) => imagesPerPage[i] ?? 0) };
}

interface TextLine {
  text: string;
  bold?: boolean;
  size?: number;
  colour?: string;
}

/** The text of one scene block, in print order. */
function sceneTextLines(s: BookScene, stage: boolean): TextLine[] {
  const out: TextLine[] = [];
  out.push({ text: shootDayLabel(s, stage), size: 8.5, colour: colours.slate });
  out.push({
    text: s.change
      ? `Change ${s.change.number}${s.change.description ? ` – ${s.change.description}` : ""}`
      : "No change set in the breakdown",
    bold: true,
  });
  const distress = `Distress stage ${s.distressStage}${s.loggedStage !== null && s.loggedStage !== s.distressStage ? ` (logged on set: ${s.loggedStage})` : ""}`;
  const flags = flagWords(s.flags);
  out.push({
    text: flags.length ? `${distress} · ${flags.join(" · ")}` : distress,
    bold: flags.length > 0,
    colour: flags.length ? colours.madder : colours.text,
  });
  if (s.garments.length) {
    out.push({ text: s.garmentsPlanned ? "Garments (planned; not logged yet):" : "Garments worn:", size: 8, colour: colours.slate });
    for (const g of s.garments) out.push({ text: garmentLine(g), size: 8.5 });
  } else {
    out.push({ text: "No garments linked to this change.", size: 8.5, colour: colours.slate });
  }
  for (const n of s.notes) out.push({ text: n, size: 8.5 });
  return out;
}
