// Yardage for a garment or a whole change: pieces grouped by fabric, each group nested on its own
// cloth width, copies multiplied by the number of costume multiples. Pure; the browser runs it in a
// worker with progress and the server runs the same code to cache the result.
import { nestPieces, nestPieceFromPanel, type NestResult, type NestSearchOptions } from "./nesting";
import type { PanelShape } from "./geometry";

/** Selvage trimmed from each side of the cloth, mm (150 cm cloth → 145 cm usable; common practice, no source). */
export const SELVAGE_EACH_SIDE_MM = 25;
/** Usable width assumed when a fabric has no recorded width, mm (common practice, no source). */
export const ASSUMED_USABLE_WIDTH_MM = 1450;

/** Usable width from the full cloth width. */
export function usableWidthMm(clothWidthMm: number | null | undefined): number {
  if (!clothWidthMm || clothWidthMm <= 2 * SELVAGE_EACH_SIDE_MM) return ASSUMED_USABLE_WIDTH_MM;
  return clothWidthMm - 2 * SELVAGE_EACH_SIDE_MM;
}

/** Pieces cut from one fabric. */
export interface YardageGroup {
  fabricId: string | null;
  fabricName: string;
  /** Full cloth width, mm (null when unknown). */
  clothWidthMm: number | null;
  panels: PanelShape[];
}

/** The marker for one fabric. */
export interface YardageFabricResult extends NestResult {
  fabricId: string | null;
  fabricName: string;
  /** Copies laid (cut counts × multiples). */
  copies: number;
}

/** How to improve the markers after the first layout (see nestPieces): one budget shared by all fabrics. */
export interface YardageSearch {
  seed?: number;
  /** Layouts tried per fabric, at most. */
  maxEvaluations?: number;
  /** Total time for all fabrics, ms; each fabric gets a share by its number of copies. */
  timeBudgetMs?: number;
  now?: () => number;
  /** Share of the whole search done, 0..1, and the fabric being improved. */
  onProgress?: (p: { fraction: number; fabricName: string; bestLengthMm: number }) => void;
}

/**
 * Nests every group; `multiples` multiplies each piece's cut count (mirrored pairs stay pairs).
 * @param onProgress called with copies done and total over all groups (first layouts)
 * @param search local search after each first layout; none when omitted
 */
export function planYardage(
  groups: readonly YardageGroup[],
  multiples: number,
  onProgress?: (done: number, total: number) => void,
  search?: YardageSearch,
): YardageFabricResult[] {
  if (!(Number.isInteger(multiples) && multiples >= 1)) throw new Error("multiples must be a whole number of at least 1");
  const total = groups.reduce((s, g) => s + g.panels.reduce((t, p) => t + p.cutCount * multiples, 0), 0);
  let before = 0;
  return groups.map((g) => {
    const pieces = g.panels.map((p) => ({ ...nestPieceFromPanel(p), cutCount: p.cutCount * multiples }));
    const copies = pieces.reduce((s, p) => s + p.cutCount, 0);
    const share = total > 0 ? copies / total : 0;
    const start = before / Math.max(1, total);
    const searchOptions: NestSearchOptions | undefined = search && {
      seed: search.seed,
      maxEvaluations: search.maxEvaluations,
      timeBudgetMs: search.timeBudgetMs === undefined ? undefined : search.timeBudgetMs * share,
      now: search.now,
      onProgress: (p) =>
        search.onProgress?.({ fraction: start + share * p.fraction, fabricName: g.fabricName, bestLengthMm: p.bestLengthMm }),
    };
    const result = nestPieces(pieces, {
      usableWidthMm: usableWidthMm(g.clothWidthMm),
      onProgress: onProgress ? (done) => onProgress(before + done, total) : undefined,
      search: searchOptions,
    });
    before += copies;
    return { ...result, fabricId: g.fabricId, fabricName: g.fabricName, copies };
  });
}
