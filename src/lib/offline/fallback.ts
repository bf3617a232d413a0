// Answers for GET requests when the network cannot be reached: from the pack this device saved for
// the account last signed in. Only what the pack holds is answered; anything else fails with a clear
// "not saved for offline" message. Online, the network always answers (see api-client).
import type { OfflinePackDto } from "@shared/schemas/offline";
import type { GarmentDto } from "@shared/schemas/garments";
import { getPack, lastAccount, packsOf } from "./store";

const copies = new WeakSet<object>();

/** True for data that came from the device's offline copy rather than the server. */
export function isOfflineCopy(data: unknown): boolean {
  return typeof data === "object" && data !== null && copies.has(data);
}

const list = <T>(rows: T[]) => ({ data: rows, pagination: { page: 1, pageSize: rows.length, total: rows.length } });

function mark<T extends object>(body: T): T {
  copies.add(body);
  const data = (body as { data?: unknown }).data;
  if (typeof data === "object" && data !== null) copies.add(data);
  return body;
}

/** Garments of the pack filtered like GET /garments (character, search text, status). */
function garmentsFor(pack: OfflinePackDto, q: URLSearchParams): GarmentDto[] {
  let rows = pack.garments;
  const characterId = q.get("characterId");
  if (characterId) {
    const items = pack.changes.filter((c) => c.characterId === characterId).flatMap((c) => c.items);
    const ids = new Set(items.map((i) => i.garmentId).filter(Boolean));
    const groups = new Set(items.map((i) => i.multiplesGroupId).filter(Boolean));
    rows = rows.filter((g) => ids.has(g.id) || (g.multiplesGroupId !== null && groups.has(g.multiplesGroupId)));
  }
  const text = q.get("q")?.toLowerCase();
  if (text) rows = rows.filter((g) => [g.name, g.tagCode, g.colour ?? "", g.vendor ?? ""].some((v) => v.toLowerCase().includes(text)));
  const status = q.get("status");
  if (status) rows = rows.filter((g) => status.split(",").includes(g.status));
  return [...rows].sort((a, b) => a.tagCode.localeCompare(b.tagCode));
}

/**
 * The response body (`{ data, … }`) the server would give for `url` (relative to /api), from the
 * saved pack; undefined when this device did not save it.
 */
export async function offlineAnswer(url: string): Promise<{ data: unknown } | undefined> {
  const account = await lastAccount();
  if (!account) return undefined;
  const u = new URL(url, "http://offline.invalid");
  const path = u.pathname.replace(/\/+$/, "");
  const q = u.searchParams;
  if (path === "/auth/me") return mark({ data: account.me });
  if (path === "/productions") return mark(list((await packsOf(account.userId)).map((p) => p.production)));
  const m = /^\/productions\/([0-9a-f-]{36})(\/.*)?$/i.exec(path);
  if (!m) return undefined;
  const pack = await getPack(account.userId, m[1]!);
  if (!pack) return undefined;
  const rest = m[2] ?? "";
  if (rest === "") return mark({ data: pack.production });
  if (rest === "/offline-pack") return undefined;
  if (rest === "/shoot-days") return mark(list(pack.shootDays));
  if (rest === "/characters") return mark({ data: pack.characters });
  if (rest === "/changes") {
    const characterId = q.get("characterId");
    return mark({ data: characterId ? pack.changes.filter((c) => c.characterId === characterId) : pack.changes });
  }
  const scene = /^\/scenes\/([0-9a-f-]{36})$/i.exec(rest);
  if (scene) {
    const s = pack.scenes.find((x) => x.id === scene[1]);
    return s ? mark({ data: s }) : undefined;
  }
  if (rest === "/continuity" && !q.get("review")) {
    const rows = pack.continuity.filter((e) =>
      (["sceneId", "characterId", "shootDayId"] as const).every((k) => !q.get(k) || e[k] === q.get(k)),
    );
    return mark(list(rows));
  }
  if (rest === "/garments") {
    const rows = garmentsFor(pack, q);
    const page = Number(q.get("page") ?? 1) || 1;
    const size = Number(q.get("pageSize") ?? 50) || 50;
    return mark({ data: rows.slice((page - 1) * size, page * size), pagination: { page, pageSize: size, total: rows.length } });
  }
  return undefined;
}
