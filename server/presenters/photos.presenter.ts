import type { PhotoDto } from "@shared/schemas/photos.js";
import type { Photo } from "../models/index.js";

/** A photo with the authenticated API paths of its sizes. */
export function presentPhoto(p: Photo): PhotoDto {
  const base = `/api/productions/${p.productionId}/photos/${p.id}/file`;
  return {
    id: p.id,
    ownerType: p.ownerType,
    ownerId: p.ownerId,
    view: p.view,
    caption: p.caption,
    width: p.width,
    height: p.height,
    bytes: p.bytes,
    contentHash: p.contentHash,
    createdAt: p.createdAt.toISOString(),
    urls: { thumb: `${base}?size=thumb`, display: `${base}?size=display`, original: `${base}?size=original` },
  };
}
