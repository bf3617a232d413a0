import type { Panel } from "../models/index.js";
import type { PanelDto } from "@shared/schemas/doubles.js";
import { perimeter, polygonArea } from "@shared/domain/panels/geometry.js";
import { cutAreaOf } from "../services/panel-cut-area.js";

/** A panel with its areas (shoelace) and effective fabric. */
export function presentPanel(p: Panel, garmentFabricId: string | null): PanelDto {
  const cutAreaMm2 = cutAreaOf(p);
  return {
    id: p.id,
    garmentId: p.garmentId,
    name: p.name,
    outline: p.outline,
    grainline: p.grainline,
    notches: p.notches,
    seamAllowanceMm: p.seamAllowanceMm,
    cutCount: p.cutCount,
    mirrored: p.mirrored,
    grainMode: p.grainMode,
    fabricId: p.fabricId,
    effectiveFabricId: p.fabricId ?? garmentFabricId,
    source: p.source,
    sortOrder: p.sortOrder,
    areaMm2: polygonArea(p.outline),
    cutAreaMm2,
    perimeterMm: perimeter(p.outline),
    updatedAt: p.updatedAt.toISOString(),
  };
}
