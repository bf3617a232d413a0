// Continuity books: the data of one character's book (story order, shoot days, change, garment copies,
// state, flags, notes, photos) read once per production and rendered to PDF. Measurements are never
// read into a book.
import { QueryTypes } from "sequelize";
import type { Writable } from "node:stream";
import { sequelize } from "../db.js";
import { Production } from "../models/index.js";
import { NotFoundError } from "../errors.js";
import { getStorage } from "../lib/storage.js";
import { productionToday } from "../lib/clock.js";
import {
  renderContinuityBook,
  type BookGarment,
  type BookModel,
  type BookPhoto,
  type BookRenderResult,
  type BookScene,
} from "../lib/pdf/continuity-book-pdf.js";
import { loadSnapshot } from "./snags.service.js";
import type { Actor } from "../middleware/require-auth.js";
import { buildIndex } from "@shared/domain/snags/engine.js";
import { planMultiples, type GroupPlan } from "@shared/domain/snags/multiples.js";
import type { SnapshotIndex } from "@shared/domain/snags/types.js";
import { DEFAULT_PAPER_SIZE, type PaperSize, type ProductionSettings } from "@shared/schemas/productions.js";
import type { BookPhotoSize, ContinuityBookCharacterDto } from "@shared/schemas/reports.js";
import type { PhotoView } from "@shared/schemas/photos.js";
import { Limits } from "@shared/constants.js";

/** Longest printed photo edge per size choice: thumbnails as stored, display size at 300 dpi in the frame. */
export const PRINT_PHOTO_PX: Record<BookPhotoSize, number> = { thumb: Limits.photoThumbPx, display: Limits.photoPrintPx };

type Row = Record<string, unknown>;

/** Everything the books of one production share, read once (a ZIP of every book reads it once). */
export interface BookContext {
  productionId: string;
  title: string;
  stage: boolean;
  paperSize: PaperSize;
  today: string;
  ix: SnapshotIndex;
  plans: GroupPlan[];
  scenes: Map<string, { setName: string | null; intExt: string | null; timeOfDay: string | null }>;
  appearanceNotes: Map<string, string | null>;
  changes: Map<string, { number: number; description: string | null }>;
  days: Map<string, { date: string; dayNumber: number; kind: "shoot" | "performance" }>;
  daysOfScene: Map<string, string[]>;
}

/** The paper size a production prints on. */
export function paperSizeOf(p: { settings?: ProductionSettings | null }): PaperSize {
  return p.settings?.paperSize ?? DEFAULT_PAPER_SIZE;
}

/** Reads what every book of a production needs. */
export async function loadBookContext(productionId: string): Promise<BookContext> {
  const production = await Production.findByPk(productionId);
  if (!production) throw NotFoundError("Production not found.");
  const q = <T extends Row>(sql: string) => sequelize.query<T>(sql, { replacements: { pid: productionId }, type: QueryTypes.SELECT });
  const [loaded, scenes, apps, changes, days, dayScenes] = await Promise.all([
    loadSnapshot(productionId),
    q(`SELECT id, set_name, int_ext, time_of_day FROM scenes WHERE production_id = :pid`),
    q(`SELECT id, notes FROM appearances WHERE production_id = :pid`),
    q(`SELECT id, number, description FROM changes WHERE production_id = :pid`),
    q(
      `SELECT id, to_char(date, 'YYYY-MM-DD') AS date, day_number, kind FROM shoot_days WHERE production_id = :pid ORDER BY date, day_number`,
    ),
    q(`SELECT shoot_day_id, scene_id FROM shoot_day_scenes WHERE production_id = :pid`),
  ]);
  const ix = buildIndex(loaded.snapshot);
  const dayMap = new Map(
    days.map((d) => [
      d.id as string,
      {
        date: d.date as string,
        dayNumber: Number(d.day_number),
        kind: d.kind === "performance" ? ("performance" as const) : ("shoot" as const),
      },
    ]),
  );
  const daysOfScene = new Map<string, string[]>();
  for (const r of dayScenes)
    (daysOfScene.get(r.scene_id as string) ?? daysOfScene.set(r.scene_id as string, []).get(r.scene_id as string)!).push(
      r.shoot_day_id as string,
    );
  for (const l of daysOfScene.values()) l.sort((a, b) => (dayMap.get(a)?.date ?? "").localeCompare(dayMap.get(b)?.date ?? ""));
  return {
    productionId,
    title: production.title,
    stage: production.kind === "stage",
    paperSize: paperSizeOf(production),
    today: productionToday(production),
    ix,
    plans: planMultiples(ix),
    scenes: new Map(
      scenes.map((s) => [
        s.id as string,
        {
          setName: (s.set_name as string | null) ?? null,
          intExt: (s.int_ext as string | null) ?? null,
          timeOfDay: (s.time_of_day as string | null) ?? null,
        },
      ]),
    ),
    appearanceNotes: new Map(apps.map((a) => [a.id as string, (a.notes as string | null) ?? null])),
    changes: new Map(
      changes.map((c) => [c.id as string, { number: Number(c.number), description: (c.description as string | null) ?? null }]),
    ),
    days: dayMap,
    daysOfScene,
  };
}

/** The copy the plan gives an appearance's change item (0-based), from its first scheduled use. */
function plannedCopy(plans: GroupPlan[], appearanceId: string, itemId: string): number | null {
  for (const p of plans) {
    const i = p.demands.findIndex((d) => d.appearanceId === appearanceId && d.itemId === itemId);
    if (i >= 0) return p.copyOf[i]!;
  }
  return null;
}

/**
 * One character's book (or one change's scenes), in story order.
 * @throws NotFoundError when the character or change is not in the production
 */
export async function continuityBookModel(
  ctx: BookContext,
  characterId: string,
  opts: { changeId?: string; photoSize: BookPhotoSize },
): Promise<BookModel> {
  const ix = ctx.ix;
  const character = ix.charactersById.get(characterId);
  if (!character) throw NotFoundError("Character not found.");
  const onlyChange = opts.changeId ? ix.changesById.get(opts.changeId) : undefined;
  if (opts.changeId && (!onlyChange || onlyChange.characterId !== characterId)) throw NotFoundError("Change not found for this character.");

  // Appearances (the breakdown) carry required state; entries (what was logged) carry what was worn.
  const apps = ix.snapshot.appearances.filter((a) => a.characterId === characterId && (!opts.changeId || a.changeId === opts.changeId));
  // Appearances without a change are not in the snapshot; read them so every scene the character plays appears.
  const extra = opts.changeId
    ? []
    : await sequelize.query<{
        id: string;
        scene_id: string;
        distress_stage: number;
        wet: boolean;
        stunt: boolean;
        blood: boolean;
        vfx_shot: boolean;
      }>(
        `SELECT id, scene_id, distress_stage, wet, stunt, blood, vfx_shot FROM appearances WHERE production_id = :pid AND character_id = :cid AND change_id IS NULL`,
        { replacements: { pid: ctx.productionId, cid: characterId }, type: QueryTypes.SELECT },
      );
  const entries = await sequelize.query<{
    id: string;
    scene_id: string;
    shoot_day_id: string | null;
    distress_stage: number | null;
    notes: string | null;
    logged_on: string;
  }>(
    `SELECT id, scene_id, shoot_day_id, distress_stage, notes, to_char(created_at, 'YYYY-MM-DD') AS logged_on
       FROM continuity_entries WHERE production_id = :pid AND character_id = :cid ORDER BY created_at, id`,
    { replacements: { pid: ctx.productionId, cid: characterId }, type: QueryTypes.SELECT },
  );
  const entryIds = entries.map((e) => e.id);
  const [worn, photos] = entryIds.length
    ? await Promise.all([
        sequelize.query<{ entry_id: string; garment_id: string }>(
          `SELECT continuity_entry_id AS entry_id, garment_id FROM continuity_entry_garments WHERE production_id = :pid AND continuity_entry_id IN (:ids)`,
          { replacements: { pid: ctx.productionId, ids: entryIds }, type: QueryTypes.SELECT },
        ),
        sequelize.query<{ id: string; owner_id: string; view: PhotoView; caption: string | null; variants: Record<string, string> }>(
          `SELECT id, owner_id, view, caption, variants FROM photos WHERE production_id = :pid AND owner_type = 'continuity_entry' AND owner_id IN (:ids) ORDER BY created_at, id`,
          { replacements: { pid: ctx.productionId, ids: entryIds }, type: QueryTypes.SELECT },
        ),
      ])
    : [[], []];

  const garmentOf = (id: string): BookGarment | null => {
    const g = ix.garmentsById.get(id);
    if (!g) return null;
    const held = g.multiplesGroupId ? (ix.groupCopies.get(g.multiplesGroupId)?.length ?? null) : null;
    return { tagCode: g.tagCode, name: g.name, copyNumber: g.multiplesGroupId ? (g.copyNumber ?? null) : null, copiesHeld: held };
  };

  const scenes: BookScene[] = [];
  const rows = [
    ...apps.map((a) => ({
      id: a.id,
      sceneId: a.sceneId,
      changeId: a.changeId as string | null,
      distressStage: a.distressStage,
      flags: { wet: a.wet, stunt: a.stunt, blood: a.blood, vfxShot: a.vfxShot },
    })),
    ...extra.map((a) => ({
      id: a.id,
      sceneId: a.scene_id,
      changeId: null,
      distressStage: Number(a.distress_stage),
      flags: { wet: a.wet, stunt: a.stunt, blood: a.blood, vfxShot: a.vfx_shot },
    })),
  ];
  rows.sort((a, b) => (ix.scenesById.get(a.sceneId)?.storyOrder ?? 0) - (ix.scenesById.get(b.sceneId)?.storyOrder ?? 0));
  for (const a of rows) {
    const scene = ix.scenesById.get(a.sceneId);
    if (!scene) continue;
    const info = ctx.scenes.get(a.sceneId);
    const mine = entries.filter((e) => e.scene_id === a.sceneId);
    const mineIds = new Set(mine.map((e) => e.id));
    const wornIds = [...new Set(worn.filter((w) => mineIds.has(w.entry_id)).map((w) => w.garment_id))];
    let garments = wornIds.map(garmentOf).filter((g): g is BookGarment => g !== null);
    const planned = garments.length === 0;
    if (planned && a.changeId) {
      for (const item of ix.itemsByChange.get(a.changeId) ?? []) {
        if (item.garmentId) {
          const g = garmentOf(item.garmentId);
          if (g) garments.push(g);
        } else if (item.multiplesGroupId) {
          const copies = ix.groupCopies.get(item.multiplesGroupId) ?? [];
          const c = plannedCopy(ctx.plans, a.id, item.id) ?? 0;
          const g = copies[c] ? garmentOf(copies[c]!) : null;
          if (g) garments.push(g);
        }
      }
    }
    garments = garments.sort((x, y) => x.tagCode.localeCompare(y.tagCode));
    const lastLogged = [...mine].reverse().find((e) => e.distress_stage !== null);
    const notes: string[] = [];
    const appNote = ctx.appearanceNotes.get(a.id);
    if (appNote) notes.push(`Breakdown: ${appNote}`);
    for (const e of mine) if (e.notes) notes.push(`Logged ${e.logged_on}: ${e.notes}`);
    const scenePhotos: BookPhoto[] = photos
      .filter((p) => mineIds.has(p.owner_id))
      .flatMap((p) => {
        // Never the original: thumbnails by default, the stored print size when asked (older photos have
        // none and print from the display size, scaled down).
        const key =
          opts.photoSize === "display"
            ? (p.variants.print ?? p.variants.display ?? p.variants.thumb)
            : (p.variants.thumb ?? p.variants.display);
        return key ? [{ id: p.id, view: p.view, caption: p.caption, key }] : [];
      });
    const change = a.changeId ? (ctx.changes.get(a.changeId) ?? null) : null;
    scenes.push({
      number: scene.number,
      storyDay: scene.storyDay >= 0 ? scene.storyDay : null,
      setName: info?.setName ?? null,
      intExt: info?.intExt ?? null,
      timeOfDay: info?.timeOfDay ?? null,
      shootDays: (ctx.daysOfScene.get(a.sceneId) ?? []).map((id) => ctx.days.get(id)).filter((d): d is NonNullable<typeof d> => Boolean(d)),
      change,
      distressStage: a.distressStage,
      loggedStage: lastLogged?.distress_stage ?? null,
      flags: a.flags,
      garments,
      garmentsPlanned: planned,
      notes,
      photos: scenePhotos,
    });
  }
  const changeInfo = opts.changeId ? ctx.changes.get(opts.changeId) : undefined;
  return {
    productionTitle: ctx.title,
    stage: ctx.stage,
    characterName: character.name,
    changeLabel: changeInfo ? `Change ${changeInfo.number}${changeInfo.description ? ` – ${changeInfo.description}` : ""}` : null,
    printedOn: ctx.today,
    paperSize: ctx.paperSize,
    scenes,
  };
}

/** Renders a book to a stream, reading photos from storage. */
export function writeContinuityBook(model: BookModel, out: Writable, photoSize: BookPhotoSize): Promise<BookRenderResult> {
  const storage = getStorage();
  return renderContinuityBook(model, out, { loadPhoto: (key) => storage.get(key), maxPhotoPx: PRINT_PHOTO_PX[photoSize] });
}

/** Reads one character's book (optionally one change) for the actor's production. */
export async function prepareContinuityBook(
  actor: Actor,
  characterId: string,
  opts: { changeId?: string; photoSize: BookPhotoSize },
): Promise<BookModel> {
  const ctx = await loadBookContext(actor.productionId);
  return continuityBookModel(ctx, characterId, opts);
}

/** "continuity-maud-penhallow.pdf" (ASCII only, for any file system). */
export function bookFileName(model: BookModel): string {
  const slug = (s: string) =>
    s
      .normalize("NFKD")
      .replace(/[^\w\s-]/g, "")
      .trim()
      .toLowerCase()
      .replace(/[\s_]+/g, "-")
      .slice(0, 60) || "book";
  return `continuity-${slug(model.characterName)}${model.changeLabel ? `-${slug(model.changeLabel.split(" – ")[0]!)}` : ""}.pdf`;
}

/** Characters with scene, photo and change counts for the continuity-books page. */
export async function continuityBookCharacters(actor: Actor): Promise<ContinuityBookCharacterDto[]> {
  const rep = { replacements: { pid: actor.productionId }, type: QueryTypes.SELECT } as const;
  const [chars, changes, photos] = await Promise.all([
    sequelize.query<{ id: string; name: string; scenes: string }>(
      `SELECT c.id, c.name, count(a.id) AS scenes FROM characters c LEFT JOIN appearances a ON a.character_id = c.id
        WHERE c.production_id = :pid GROUP BY c.id ORDER BY c.sort_order, c.name`,
      rep,
    ),
    sequelize.query<{ id: string; character_id: string; number: number; description: string | null; scenes: string }>(
      `SELECT ch.id, ch.character_id, ch.number, ch.description, count(a.id) AS scenes FROM changes ch LEFT JOIN appearances a ON a.change_id = ch.id
        WHERE ch.production_id = :pid GROUP BY ch.id ORDER BY ch.number`,
      rep,
    ),
    sequelize.query<{ character_id: string; n: string }>(
      `SELECT e.character_id, count(p.id) AS n FROM continuity_entries e JOIN photos p ON p.owner_type = 'continuity_entry' AND p.owner_id = e.id
        WHERE e.production_id = :pid GROUP BY e.character_id`,
      rep,
    ),
  ]);
  const photoCount = new Map(photos.map((p) => [p.character_id, Number(p.n)]));
  return chars.map((c) => ({
    id: c.id,
    name: c.name,
    scenes: Number(c.scenes),
    photos: photoCount.get(c.id) ?? 0,
    changes: changes
      .filter((x) => x.character_id === c.id)
      .map((x) => ({ id: x.id, number: Number(x.number), description: x.description, scenes: Number(x.scenes) })),
  }));
}
