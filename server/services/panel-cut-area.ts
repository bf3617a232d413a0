import type { Panel } from "../models/index.js";
import { polygonArea } from "@shared/domain/panels/geometry.js";
import { cutLineFromSewLine } from "@shared/domain/panels/offset.js";

// The area inside a panel's cut line (sew line offset by the seam allowance with clipper-lib).
// Offsetting a large outline takes milliseconds; lists present the same panels again and again, so
// the cut-line area is remembered per panel version (a derived value: any server can recompute it).
const cutAreas = new Map<string, number | null>();
const CUT_AREA_CACHE_MAX = 5000;

function cutAreaKey(p: Pick<Panel, "id" | "updatedAt" | "seamAllowanceMm">): string {
  return `${p.id}:${p.updatedAt.getTime()}:${p.seamAllowanceMm}`;
}

/** Remembers a cut-line area computed elsewhere (e.g. by the worker that read the DXF); null: no cut line. */
export function rememberCutArea(p: Pick<Panel, "id" | "updatedAt" | "seamAllowanceMm">, areaMm2: number | null): void {
  if (cutAreas.size >= CUT_AREA_CACHE_MAX) cutAreas.delete(cutAreas.keys().next().value!);
  cutAreas.set(cutAreaKey(p), areaMm2);
}

/**
 * Cut-line area of a panel, mm² (remembered per panel version), or null when clipper cannot draw the cut
 * line from this outline: the sew-line area is then not passed off as the cut area.
 */
export function cutAreaOf(p: Panel): number | null {
  const known = cutAreas.get(cutAreaKey(p));
  if (known !== undefined) return known;
  let area: number | null;
  try {
    area = polygonArea(cutLineFromSewLine(p.outline, p.seamAllowanceMm));
  } catch {
    area = null;
  }
  rememberCutArea(p, area);
  return area;
}
