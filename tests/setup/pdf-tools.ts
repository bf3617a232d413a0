/**
 * Reading PDFs the way an outside reader does: poppler-utils (pdftotext, pdfimages, pdfinfo,
 * pdftoppm, installed by .ci/run) and a QR decoder from the ZXing port (@zxing/library).
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

/** The text of each page (pdftotext -layout; pages split at form feeds). */
export async function pdfPagesText(pdf: Buffer): Promise<string[]> {
  return withFile(pdf, async (file) => {
    const { stdout } = await run("pdftotext", ["-layout", "-enc", "UTF-8", file, "-"], { maxBuffer: 64 * 1024 * 1024 });
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
  for (let i = 0, p = 0; i < lum.length; i++, p += info.channels) lum[i] = (data[p]! * 299 + data[p + 1]! * 587 + data[p + 2]! * 114) / 1000;
  const source = new RGBLuminanceSource(lum, info.width, info.height);
  const hints = new Map([[DecodeHintType.TRY_HARDER, true]]);
  return new QRCodeReader().decode(new BinaryBitmap(new HybridBinarizer(source)), hints).getText();
}
