import { z } from "zod";
import { idSchema } from "./common.js";

export const photoViews = ["front", "back", "left", "right", "detail", "other"] as const;
export type PhotoView = (typeof photoViews)[number];
export const photoSizes = ["thumb", "display", "original"] as const;
export type PhotoSize = (typeof photoSizes)[number];

/** Multipart fields sent with `file`. */
export const uploadPhotoFieldsSchema = z.object({
  ownerType: z.string().trim().min(1).max(30),
  ownerId: idSchema,
  view: z.enum(photoViews).default("other"),
  caption: z
    .string()
    .trim()
    .max(300)
    .nullish()
    .transform((v) => (v ? v : null)),
});

export const listPhotosQuerySchema = z.object({ ownerType: z.string().trim().min(1).max(30), ownerId: idSchema });
export const photoFileQuerySchema = z.object({ size: z.enum(photoSizes).default("display") });

export interface PhotoDto {
  id: string;
  ownerType: string;
  ownerId: string;
  view: PhotoView;
  caption: string | null;
  width: number;
  height: number;
  bytes: number;
  contentHash: string;
  createdAt: string;
  /** API paths of the three stored sizes (authenticated). */
  urls: Record<PhotoSize, string>;
}
