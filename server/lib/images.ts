// The only sharp import. Every stored size is re-encoded from the decoded pixels, so no EXIF, GPS,
// XMP or IPTC block survives (sharp drops metadata unless asked to keep it).
import sharp from "sharp";
import { Limits } from "@shared/constants.js";

/** Why an upload is not a usable image. */
export class ImageRejectedError extends Error {
  constructor(
    public readonly reason: "not_image" | "too_many_pixels",
    message: string,
  ) {
    super(message);
    this.name = "ImageRejectedError";
  }
}

const PRINT_JPEG_QUALITY = 78;

/** Formats we decode; anything else is refused whatever the file name says. */
const ACCEPTED_FORMATS = new Set(["jpeg", "png", "webp", "avif", "heif", "tiff"]);

/** The stored sizes of one photo, encoded and ready to write. */
export interface ImageVariants {
  /** Width and height after auto-orientation. */
  width: number;
  height: number;
  files: {
    original: { body: Buffer; contentType: string; ext: string };
    display: { body: Buffer; contentType: string; ext: string };
    /** JPEG at print size: reports embed it as stored instead of decoding the display WebP. */
    print: { body: Buffer; contentType: string; ext: string };
    thumb: { body: Buffer; contentType: string; ext: string };
  };
}

function open(input: string | Buffer) {
  // limitInputPixels refuses decompression bombs from the header, before decoding.
  return sharp(input, { limitInputPixels: Limits.photoMaxPixels, failOn: "error", sequentialRead: true });
}

/**
 * Checks that the input is an accepted image within the pixel limit and makes the three stored
 * sizes: full resolution (JPEG), display and thumbnail (WebP), all auto-oriented and metadata-free.
 */
export async function makeVariants(input: string | Buffer): Promise<ImageVariants> {
  let meta: sharp.Metadata;
  try {
    meta = await open(input).metadata();
  } catch (err) {
    if ((err as Error).message?.includes("pixel limit"))
      throw new ImageRejectedError("too_many_pixels", `The image exceeds the ${Limits.photoMaxPixels / 1e6}-megapixel limit.`);
    throw new ImageRejectedError("not_image", `The file is not an image we can read (${(err as Error).message}).`);
  }
  if (!meta.format || !ACCEPTED_FORMATS.has(meta.format))
    throw new ImageRejectedError("not_image", "The file is not a JPEG, PNG, WebP, AVIF, HEIF or TIFF image.");
  const w = meta.width ?? 0;
  const h = meta.height ?? 0;
  if (w * h > Limits.photoMaxPixels)
    throw new ImageRejectedError(
      "too_many_pixels",
      `The image is ${w} × ${h} pixels; the limit is ${Limits.photoMaxPixels / 1e6} megapixels.`,
    );
  // EXIF orientations 5–8 are rotated a quarter turn, so width and height swap.
  const swap = (meta.orientation ?? 1) >= 5;
  const width = swap ? h : w;
  const height = swap ? w : h;
  try {
    const base = open(input).rotate();
    const [original, display, print, thumb] = await Promise.all([
      // mozjpeg off: it is several times slower on 12-megapixel frames for a small size gain.
      base.clone().jpeg({ quality: 88, chromaSubsampling: "4:2:0" }).toBuffer(),
      base
        .clone()
        .resize({ width: Limits.photoDisplayPx, height: Limits.photoDisplayPx, fit: "inside", withoutEnlargement: true })
        .webp({ quality: 80 })
        .toBuffer(),
      base
        .clone()
        .resize({ width: Limits.photoPrintPx, height: Limits.photoPrintPx, fit: "inside", withoutEnlargement: true })
        .flatten({ background: "#ffffff" })
        .jpeg({ quality: PRINT_JPEG_QUALITY, chromaSubsampling: "4:2:0" })
        .toBuffer(),
      base
        .clone()
        .resize({ width: Limits.photoThumbPx, height: Limits.photoThumbPx, fit: "inside", withoutEnlargement: true })
        .webp({ quality: 72 })
        .toBuffer(),
    ]);
    return {
      width,
      height,
      files: {
        original: { body: original, contentType: "image/jpeg", ext: "jpg" },
        display: { body: display, contentType: "image/webp", ext: "webp" },
        print: { body: print, contentType: "image/jpeg", ext: "jpg" },
        thumb: { body: thumb, contentType: "image/webp", ext: "webp" },
      },
    };
  } catch (err) {
    if ((err as Error).message?.includes("pixel limit"))
      throw new ImageRejectedError("too_many_pixels", "The image exceeds the pixel limit.");
    throw new ImageRejectedError("not_image", `The image could not be decoded (${(err as Error).message}).`);
  }
}

/** Reads width, height, format and whether any metadata block is present (for checks and tests). */
export async function describeImage(input: Buffer): Promise<{
  width: number;
  height: number;
  format: string;
  hasExif: boolean;
  hasXmp: boolean;
  hasIptc: boolean;
  orientation: number | null;
}> {
  const m = await sharp(input).metadata();
  return {
    width: m.width ?? 0,
    height: m.height ?? 0,
    format: m.format ?? "",
    hasExif: Boolean(m.exif),
    hasXmp: Boolean(m.xmp),
    hasIptc: Boolean(m.iptc),
    orientation: m.orientation ?? null,
  };
}

/** Draws a plain swatch image with a label (demo data and benchmarks; never photos of people). */
export async function renderSwatch(opts: {
  width: number;
  height: number;
  background: string;
  label: string;
  sublabel?: string;
  format?: "jpeg" | "png";
}): Promise<Buffer> {
  const esc = (s: string) => s.replace(/[&<>"]/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;" })[c]!);
  const fs = Math.round(opts.width / 14);
  const w = (f: number) => Math.round(opts.width * f);
  const h = (f: number) => Math.round(opts.height * f);
  const svg = `<svg xmlns="http://www.w3.org/2000/svg" width="${opts.width}" height="${opts.height}">
  <rect width="100%" height="100%" fill="${opts.background}"/>
  <path d="M ${w(0.42)} ${h(0.15)} L ${w(0.58)} ${h(0.15)} L ${w(0.75)} ${h(0.2)} L ${w(0.86)} ${h(0.6)} L ${w(0.76)} ${h(0.62)} L ${w(0.68)} ${h(0.35)} L ${w(0.68)} ${h(0.88)} L ${w(0.32)} ${h(0.88)} L ${w(0.32)} ${h(0.35)} L ${w(0.24)} ${h(0.62)} L ${w(0.14)} ${h(0.6)} L ${w(0.25)} ${h(0.2)} Z" fill="#F7F4EE" fill-opacity="0.35" stroke="#F7F4EE" stroke-width="${Math.max(2, opts.width / 200)}"/>
  <text x="50%" y="${opts.height * 0.1}" font-family="sans-serif" font-size="${fs}" fill="#F7F4EE" text-anchor="middle">${esc(opts.label)}</text>
  ${opts.sublabel ? `<text x="50%" y="${opts.height * 0.95}" font-family="sans-serif" font-size="${Math.round(fs * 0.6)}" fill="#F7F4EE" text-anchor="middle">${esc(opts.sublabel)}</text>` : ""}
</svg>`;
  const img = sharp(Buffer.from(svg));
  return opts.format === "png" ? img.png().toBuffer() : img.jpeg({ quality: 85 }).toBuffer();
}

/**
 * A stored photo size as a JPEG for a printed report: PDF readers show JPEG natively, and the longest
 * edge is capped at `maxPx` so a book stays small. A JPEG already within `maxPx` (the stored print
 * size, written by us without metadata) is used as stored: decoding the WebP sizes is most of a book's time.
 */
export async function toPrintJpeg(
  input: Buffer,
  maxPx: number,
  quality = PRINT_JPEG_QUALITY,
): Promise<{ body: Buffer; width: number; height: number }> {
  if (input[0] === 0xff && input[1] === 0xd8) {
    const meta = await sharp(input, { failOn: "error" }).metadata();
    if (meta.format === "jpeg" && meta.width && meta.height && Math.max(meta.width, meta.height) <= maxPx && (meta.orientation ?? 1) === 1)
      return { body: input, width: meta.width, height: meta.height };
  }
  const { data, info } = await sharp(input, { failOn: "error" })
    .resize({ width: maxPx, height: maxPx, fit: "inside", withoutEnlargement: true })
    .flatten({ background: "#ffffff" })
    .jpeg({ quality, chromaSubsampling: "4:2:0" })
    .toBuffer({ resolveWithObject: true });
  return { body: data, width: info.width, height: info.height };
}
