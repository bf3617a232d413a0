// The apparel pattern exchange conventions of ASTM D6673 (the DXF layout pattern systems share): each
// piece is a BLOCK placed by an INSERT; inside it every kind of line sits on its own numbered layer, and
// the piece's facts are TEXT lines of the form "Label: value".
//
// The layer numbers and text labels below are FROM MEMORY of the standard (not checked against the
// published text here); docs/references.md says so too. Layer 12 is left out because we do not recall it.

/** What a numbered layer holds. */
export type AstmLayerRole =
  | "cut_line"
  | "turn_points"
  | "curve_points"
  | "notches"
  | "grade_reference"
  | "mirror_line"
  | "grain_line"
  | "internal_lines"
  | "stripe_reference"
  | "plaid_reference"
  | "internal_cutouts"
  | "drill_holes"
  | "sew_line"
  | "annotation"
  | "quality_validation";

/** Layer number → role (from memory, see the file comment). */
export const ASTM_D6673_LAYERS: Readonly<Record<number, AstmLayerRole>> = {
  1: "cut_line", // piece boundary (from memory)
  2: "turn_points", // corner points of the boundary (from memory)
  3: "curve_points", // points along curves (from memory)
  4: "notches", // from memory
  5: "grade_reference", // grade reference / alternate grade reference line (from memory)
  6: "mirror_line", // fold line of a piece cut on the fold (from memory)
  7: "grain_line", // from memory
  8: "internal_lines", // darts, pocket and button placements drawn inside (from memory)
  9: "stripe_reference", // from memory
  10: "plaid_reference", // from memory
  11: "internal_cutouts", // from memory
  13: "drill_holes", // from memory
  14: "sew_line", // from memory
  15: "annotation", // annotation text (from memory)
  80: "notches", // T-notch (from memory)
  81: "notches", // castle notch (from memory)
  82: "notches", // check notch (from memory)
  83: "notches", // U-notch (from memory)
  84: "quality_validation", // boundary quality-validation curve (from memory)
  85: "quality_validation", // internal-line quality-validation curve (from memory)
  86: "quality_validation", // internal cut-out quality-validation curve (from memory)
  87: "quality_validation", // sew-line quality-validation curve (from memory)
};

/** The layers the writer uses. */
export const ASTM_LAYER = { cutLine: 1, notches: 4, grainLine: 7, sewLine: 14, annotation: 15 } as const;

/** Plain words for each role, used when the import preview says what it found or skipped. */
export const ASTM_ROLE_LABEL: Readonly<Record<AstmLayerRole, string>> = {
  cut_line: "cut line",
  turn_points: "turn points",
  curve_points: "curve points",
  notches: "notches",
  grade_reference: "grade reference line",
  mirror_line: "mirror (fold) line",
  grain_line: "grain line",
  internal_lines: "internal lines",
  stripe_reference: "stripe reference line",
  plaid_reference: "plaid reference line",
  internal_cutouts: "internal cut-outs",
  drill_holes: "drill holes",
  sew_line: "sew line",
  annotation: "annotation text",
  quality_validation: "quality-validation curves",
};

/** Role of a layer name under ASTM D6673 numbering, or null for a layer that is not a known number. */
export function astmLayerRole(layer: string | undefined): AstmLayerRole | null {
  if (!layer || !/^\s*\d{1,3}\s*$/.test(layer)) return null;
  return ASTM_D6673_LAYERS[Number(layer)] ?? null;
}

/** Piece annotation labels (from memory): "Piece Name: Front", "Size: 12", "Quantity: 2", … */
export const ASTM_TEXT_LABEL = {
  pieceName: "Piece Name",
  size: "Size",
  quantity: "Quantity",
  category: "Category",
  styleName: "Style Name",
  annotation: "Annotation",
} as const;

/** Splits "Label: value" into its parts (label compared case-insensitively), or null. */
export function splitLabelledText(text: string): { label: string; value: string } | null {
  const m = /^\s*([A-Za-z][A-Za-z ]{1,30}?)\s*:\s*(.*?)\s*$/.exec(text);
  return m ? { label: m[1].toLowerCase(), value: m[2] } : null;
}
