/** Limits both sides use. */
export const Limits = {
  pageSizeDefault: 50,
  pageSizeMax: 500,
  nameMax: 160,
  titleMax: 200,
  notesMax: 5000,
  passwordMin: 10,
  passwordMax: 200,
  invitationDays: 7,
  passwordResetMinutes: 60,
  /** Photo uploads: bytes per file, files per request, decoded pixels (decompression-bomb guard). */
  photoMaxBytes: 30 * 1024 * 1024,
  photoMaxFiles: 8,
  photoMaxPixels: 50_000_000,
  /** Longest edge of the stored display and thumbnail sizes. */
  photoDisplayPx: 1600,
  photoThumbPx: 320,
  /**
   * Longest edge of the stored print size (JPEG): 300 dpi at a continuity book's photo frame, a quarter
   * of the text width at 4:3, about 42 × 56 mm on A4 and US Letter (56 mm ≈ 660 px).
   */
  photoPrintPx: 660,
  /**
   * Pattern pieces. Points per outline after curves are flattened (a bodice at 0.01 mm chord tolerance
   * has a few hundred; the checks, nesting and meshes stay quick well past this).
   */
  panelMaxVertices: 5000,
  /** DXF uploads: bytes, pieces per file, points and entities after blocks are placed and curves flattened. */
  dxfMaxBytes: 5 * 1024 * 1024,
  dxfMaxPieces: 200,
  dxfMaxTotalVertices: 250_000,
  dxfMaxEntities: 200_000,
  /** Panels in one handoff packet. */
  packetMaxPanels: 200,
} as const;

/** Photo file types accepted for upload: extension → MIME types a browser may send for it. */
export const photoUploadTypes: Record<string, readonly string[]> = {
  jpg: ["image/jpeg", "image/pjpeg"],
  jpeg: ["image/jpeg", "image/pjpeg"],
  png: ["image/png"],
  webp: ["image/webp"],
  avif: ["image/avif"],
  tif: ["image/tiff"],
  tiff: ["image/tiff"],
};
