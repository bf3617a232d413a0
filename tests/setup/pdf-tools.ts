/**
 * Reading PDFs the way an outside reader does: poppler-utils (pdftotext, pdfimages, pdfinfo,
 * pdftoppm, installed by .ci/run) and a QR decoder (ISO/IEC 18004) from the ZXing port (@zxing/library).
 */
import { execFile } from "node:child_process";
import { mkdtemp, readFile, rm, writeFile } from "node:fs/promises";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import sharp from "sharp";
import { BinaryBitmap, DecodeHintType, HybridBinarizer, QRCodeReader, RGBLuminanceSource } from "@zxing/library";

const run = promisify(execFile);

async function withFile<T>(pdf: Buffer, fn: (file: string, dir: string) => Promise<T>): Promise<T> {
  const dir = await mkdtemp(path.join(os.tmpdir(), "seamscene-pdf-"));
  try {
    const file = path.join(dir, "doc.pdf");
    await writeFile(file, pdf);
    return await fn(file, dir);
  } finally {
    await rm(dir, { recursive: true, force: true });
  }
}

/**
 * The text of each page (pages split at form feeds): `layout` keeps the physical layout (columns side
 * by side), `raw` keeps the order the text was drawn in (a wrapped cell stays together).
 */
export async function pdfPagesText(pdf: Buffer, mode: "layout" | "raw" = "layout"): Promise<string[]> {
  return withFile(pdf, async (file) => {
    const { stdout } = await run("pdftotext", [`-${mode}`, "-enc", "UTF-8", file, "-"], { maxBuffer: 64 * 1024 * 1024 });
    const pages = stdout.split("\f");
    if (pages.length && pages[pages.length - 1]!.trim() === "") pages.pop();
    return pages;
  });
}

/** Every image placed in the document: page (1-based), pixel width and height (pdfimages -list). */
export async function pdfImageList(pdf: Buffer): Promise<Array<{ page: number; width: number; height: number; type: string }>> {
  return withFile(pdf, async (file) => {
    const { stdout } = await run("pdfimages", ["-list", file]);
    // Header, a dashed rule, then one row per image: page num type width height ...
    return stdout
      .split("\n")
      .slice(2)
      .filter((l) => l.trim())
      .map((l) => l.trim().split(/\s+/))
      .map((c) => ({ page: Number(c[0]), type: c[2]!, width: Number(c[3]), height: Number(c[4]) }));
  });
}

/** Page count and the first page's size in points (pdfinfo). */
export async function pdfInfo(pdf: Buffer): Promise<{ pages: number; width: number; height: number }> {
  return withFile(pdf, async (file) => {
    const { stdout } = await run("pdfinfo", [file]);
    const pages = Number(/Pages:\s+(\d+)/.exec(stdout)?.[1]);
    const m = /Page size:\s+([\d.]+) x ([\d.]+) pts/.exec(stdout);
    return { pages, width: Number(m?.[1]), height: Number(m?.[2]) };
  });
}

/** One page rendered to PNG (pdftoppm). */
export async function pdfPagePng(pdf: Buffer, page: number, dpi = 200): Promise<Buffer> {
  return withFile(pdf, async (file, dir) => {
    const prefix = path.join(dir, "page");
    await run("pdftoppm", ["-png", "-r", String(dpi), "-f", String(page), "-l", String(page), "-singlefile", file, prefix]);
    return readFile(`${prefix}.png`);
  });
}

/** Decodes the one QR code in an image (a crop around it works best), or throws when none is found. */
export async function decodeQr(png: Buffer): Promise<string> {
  const { data, info } = await sharp(png).removeAlpha().raw().toBuffer({ resolveWithObject: true });
  const lum = new Uint8ClampedArray(info.width * info.height);
  for (let i = 0, p = 0; i < lum.length; i++, p += info.channels)
    lum[i] = (data[p]! * 299 + data[p + 1]! * 587 + data[p + 2]! * 114) / 1000;
  const source = new RGBLuminanceSource(lum, info.width, info.height);
  const hints = new Map([[DecodeHintType.TRY_HARDER, true]]);
  return new QRCodeReader().decode(new BinaryBitmap(new HybridBinarizer(source)), hints).getText();
}

/**
 * Decodes every QR code in a vertical column of a rendered page (codes stacked one under another,
 * like the rack list's): the column is cut into blocks of ink separated by blank bands, and each
 * block about `codeMm` tall is decoded on its own.
 */
export async function decodeQrColumn(png: Buffer, opts: { dpi: number; fromMm: number; toMm: number; codeMm: number }): Promise<string[]> {
  const px = (mm: number) => Math.round((mm / 25.4) * opts.dpi);
  const meta = await sharp(png).metadata();
  const left = px(opts.fromMm);
  const width = Math.min(px(opts.toMm) - left, (meta.width ?? 0) - left);
  const strip = await sharp(png)
    .extract({ left, top: 0, width, height: meta.height! })
    .greyscale()
    .raw()
    .toBuffer({ resolveWithObject: true });
  const inked: boolean[] = [];
  for (let y = 0; y < strip.info.height; y++) {
    let dark = false;
    for (let x = 0; x < strip.info.width && !dark; x++) dark = strip.data[y * strip.info.width + x]! < 100;
    inked.push(dark);
  }
  // Blocks of inked rows, joining gaps shorter than 1.2 mm (a white module row inside a code is about 0.7 mm).
  const blocks: Array<[number, number]> = [];
  let start = -1;
  let lastInk = -1;
  inked.forEach((dark, y) => {
    if (!dark) return;
    if (start >= 0 && y - lastInk > px(1.2)) {
      blocks.push([start, lastInk]);
      start = y;
    } else if (start < 0) start = y;
    lastInk = y;
  });
  if (start >= 0) blocks.push([start, lastInk]);
  const codes: string[] = [];
  for (const [a, b] of blocks) {
    const h = b - a + 1;
    if (h < px(opts.codeMm * 0.7) || h > px(opts.codeMm * 1.2)) continue;
    const pad = px(2);
    const crop = await sharp(png)
      .extract({ left: Math.max(0, left - pad), top: Math.max(0, a - pad), width: width + 2 * pad, height: h + 2 * pad })
      .png()
      .toBuffer();
    codes.push(await decodeQr(crop));
  }
  return codes;
}
