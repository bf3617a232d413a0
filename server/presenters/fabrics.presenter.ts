import type { FabricDto, FabricTestDto } from "@shared/schemas/fabrics.js";
import { gsmToOzPerSqYd, roundTo } from "@shared/domain/units.js";
import type { Fabric, FabricTest } from "../models/index.js";

/** Fabric → wire shape; counts come from the list query when it computed them. */
export function presentFabric(f: Fabric, counts: { testCount?: number; garmentCount?: number } = {}): FabricDto {
  const c = f.get({ plain: true }) as unknown as { testCount?: string | number; garmentCount?: string | number };
  return {
    id: f.id,
    name: f.name,
    supplier: f.supplier,
    fibreContent: f.fibreContent,
    construction: f.construction,
    widthMm: f.widthMm,
    massPerAreaGsm: f.massPerAreaGsm,
    massPerAreaOzYd2: f.massPerAreaGsm === null ? null : roundTo(gsmToOzPerSqYd(f.massPerAreaGsm), 2),
    thicknessMm: f.thicknessMm,
    stretchWarpPct: f.stretchWarpPct,
    stretchWeftPct: f.stretchWeftPct,
    colour: f.colour,
    careNotes: f.careNotes,
    testCount: counts.testCount ?? Number(c.testCount ?? 0),
    garmentCount: counts.garmentCount ?? Number(c.garmentCount ?? 0),
  };
}

/** Fabric test → wire shape. */
export function presentFabricTest(t: FabricTest): FabricTestDto {
  return {
    id: t.id,
    fabricId: t.fabricId,
    kind: t.kind,
    direction: t.direction,
    readings: t.readings,
    derived: t.derived ?? {},
    testedOn: t.testedOn,
    testedBy: t.testedBy,
    testedByName: t.tester?.name ?? null,
    notes: t.notes,
  };
}
