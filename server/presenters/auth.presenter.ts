import type { MeDto } from "@shared/schemas/auth.js";
import type { User, Membership } from "../models/index.js";

/** The signed-in user with their productions; never the password hash. */
export function presentMe(user: User, memberships: Membership[]): MeDto {
  return {
    id: user.id,
    email: user.email,
    name: user.name,
    lastProductionId: user.lastProductionId,
    memberships: memberships
      .filter((m) => m.production)
      .map((m) => ({ productionId: m.productionId, title: m.production!.title, kind: m.production!.kind, role: m.role }))
      .sort((a, b) => a.title.localeCompare(b.title)),
  };
}
