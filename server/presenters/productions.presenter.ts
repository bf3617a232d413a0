import type { ProductionDto } from "@shared/schemas/productions.js";
import type { Production } from "../models/index.js";
import type { Role } from "@shared/permissions.js";
import { productionTimeZone, productionToday } from "../lib/clock.js";

export function presentProduction(p: Production, role: Role): ProductionDto {
  return {
    id: p.id,
    title: p.title,
    kind: p.kind,
    startsOn: p.startsOn,
    endsOn: p.endsOn,
    units: p.units,
    settings: p.settings ?? {},
    role,
    timeZone: productionTimeZone(p),
    today: productionToday(p),
  };
}
