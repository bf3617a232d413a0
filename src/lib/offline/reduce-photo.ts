// Photos are made smaller on the phone before they wait in the queue, so a day's photos fit the
// phone and the upload: long edge at most 2,400 px, JPEG at quality 0.85, upright as shot (the EXIF
// orientation is applied to the pixels; the new file carries no metadata). The server still strips
// metadata from whatever it receives.
import type { PhotoView } from "@shared/schemas/photos";
import type { QueuedPhoto } from "./db";

export const PHOTO_LONG_EDGE_PX = 2400;
export const PHOTO_JPEG_QUALITY = 0.85;

/** Width and height scaled so the long edge is at most `longEdge` (never enlarged). */
export function fitLongEdge(width: number, height: number, longEdge = PHOTO_LONG_EDGE_PX): { width: number; height: number } {
  const scale = Math.min(1, longEdge / Math.max(width, height));
  return { width: Math.max(1, Math.round(width * scale)), height: Math.max(1, Math.round(height * scale)) };
}

async function encode(bitmap: ImageBitmap, width: number, height: number): Promise<Blob> {
  if (typeof OffscreenCanvas !== "undefined") {
    const canvas = new OffscreenCanvas(width, height);
    const ctx = canvas.getContext("2d");
    if (!ctx) throw new Error("No 2D canvas");
    ctx.imageSmoothingQuality = "high";
    ctx.drawImage(bitmap, 0, 0, width, height);
    return canvas.convertToBlob({ type: "image/jpeg", quality: PHOTO_JPEG_QUALITY });
  }
  const canvas = document.createElement("canvas");
  canvas.width = width;
  canvas.height = height;
  const ctx = canvas.getContext("2d");
  if (!ctx) throw new Error("No 2D canvas");
  ctx.imageSmoothingQuality = "high";
  ctx.drawImage(bitmap, 0, 0, width, height);
  return new Promise((resolve, reject) =>
    canvas.toBlob((b) => (b ? resolve(b) : reject(new Error("The photo could not be encoded"))), "image/jpeg", PHOTO_JPEG_QUALITY),
  );
}

const jpegName = (name: string, view: PhotoView, i: number) =>
  `${(name.replace(/\.[^.]+$/, "") || view).replace(/[^\w.-]+/g, "-").slice(0, 60) || `photo-${i}`}.jpg`;

/**
 * The photo ready for the queue: decoded upright, scaled down and re-encoded as JPEG. A file the
 * browser cannot decode is kept as it is (the server decides; its limit still applies).
 */
export async function reducePhoto(file: Blob & { name?: string }, view: PhotoView, i = 0): Promise<QueuedPhoto> {
  const name = file.name ?? `${view}.jpg`;
  let bitmap: ImageBitmap | null = null;
  try {
    bitmap = await createImageBitmap(file, { imageOrientation: "from-image" });
    const { width, height } = fitLongEdge(bitmap.width, bitmap.height);
    const blob = await encode(bitmap, width, height);
    return { bytes: await blob.arrayBuffer(), type: "image/jpeg", name: jpegName(name, view, i), view, width, height };
  } catch {
    return { bytes: await file.arrayBuffer(), type: file.type || "application/octet-stream", name, view, width: 0, height: 0 };
  } finally {
    bitmap?.close();
  }
}
