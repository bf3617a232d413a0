// Stage quick changes: between a character's exit in one change and entrance in another, the
// time available is the running time of the scenes played in between (in running order).
import type { AppearanceRec, JsonValue, SceneRec, SnagDraft, SnapshotIndex } from "./types";

/** Scenes in running order: stageOrder (falling back to storyOrder), then id. */
export function runningOrder(scenes: readonly SceneRec[]): SceneRec[] {
  return [...scenes].sort((a, b) => {
    const oa = a.stageOrder ?? a.storyOrder;
    const ob = b.stageOrder ?? b.storyOrder;
    return oa - ob || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0);
  });
}

/** Facts for one quick change that is too short. */
export interface QuickChangeFacts {
  characterId: string;
  characterName: string;
  from: { appearance: AppearanceRec; sceneNumber: string; changeNumber: string };
  to: { appearance: AppearanceRec; sceneNumber: string; changeNumber: string };
  /** Scenes played in between (numbers) and their minutes; at most 12 listed. */
  between: { sceneNumber: string; minutes: number | null }[];
  /** How many scenes lie in between, and how many of them have no running time. */
  betweenCount: number;
  unknownCount: number;
  minutes: number;
  threshold: number;
}

/** The snag for a quick change below the production threshold. */
export function quickChangeSnag(f: QuickChangeFacts): SnagDraft {
  const listed = f.between.map((b) => `${b.sceneNumber} (${b.minutes === null ? "?" : b.minutes} min)`);
  if (f.betweenCount > f.between.length) listed.push(`\u2026 ${f.betweenCount - f.between.length} more`);
  const between =
    f.betweenCount === 0 ? "with no scene in between" : `with scene${f.betweenCount > 1 ? "s" : ""} ${listed.join(", ")} in between`;
  const evidence: { [k: string]: JsonValue } = {
    fromAppearanceId: f.from.appearance.id,
    toAppearanceId: f.to.appearance.id,
    fromChangeId: f.from.appearance.changeId,
    toChangeId: f.to.appearance.changeId,
    minutes: f.minutes,
    threshold: f.threshold,
    betweenCount: f.betweenCount,
    unknownCount: f.unknownCount,
  };
  return {
    key: `quick_change:${f.from.appearance.id}:${f.to.appearance.id}`,
    kind: "quick_change",
    severity: "warning",
    title: `${f.characterName}: ${f.minutes} min to change from ${f.from.changeNumber} to ${f.to.changeNumber}`,
    explanation:
      `${f.characterName} exits in change ${f.from.changeNumber} after scene ${f.from.sceneNumber} and enters in change ` +
      `${f.to.changeNumber} in scene ${f.to.sceneNumber}, ${between}: ${f.minutes} min against the ${f.threshold} min set ` +
      `for this production.` +
      (f.unknownCount ? ` Running time unknown for ${f.unknownCount} scene${f.unknownCount > 1 ? "s" : ""} in between; counted as 0.` : ""),
    subject: {
      characterId: f.characterId,
      sceneIds: [f.from.appearance.sceneId, f.to.appearance.sceneId],
      appearanceIds: [f.from.appearance.id, f.to.appearance.id],
    },
    evidence,
  };
}

/** Quick-change snags (stage productions only). Prefix sums make each gap O(1). */
export function quickChangeSnags(ix: SnapshotIndex): SnagDraft[] {
  if (!ix.isStage) return [];
  const order = runningOrder(ix.snapshot.scenes);
  const pos = new Map<string, number>();
  const prefix: number[] = [0]; // prefix[i] = minutes of scenes before position i
  const unknownPrefix: number[] = [0]; // same, counting scenes without a running time
  order.forEach((s, i) => {
    pos.set(s.id, i);
    prefix.push(prefix[i] + (s.runningMinutes ?? 0));
    unknownPrefix.push(unknownPrefix[i] + (s.runningMinutes == null ? 1 : 0));
  });
  const byChar = new Map<string, { app: AppearanceRec; p: number }[]>();
  for (const app of ix.snapshot.appearances) {
    const p = pos.get(app.sceneId);
    if (p === undefined) continue;
    let list = byChar.get(app.characterId);
    if (!list) byChar.set(app.characterId, (list = []));
    list.push({ app, p });
  }
  const threshold = ix.snapshot.production.quickChangeThresholdMin;
  const changeNo = (id: string) => {
    const c = ix.changesById.get(id);
    return c ? String(c.number) : id;
  };
  const out: SnagDraft[] = [];
  for (const [charId, list] of byChar) {
    list.sort((a, b) => a.p - b.p || (a.app.id < b.app.id ? -1 : a.app.id > b.app.id ? 1 : 0));
    for (let i = 1; i < list.length; i++) {
      const a = list[i - 1];
      const b = list[i];
      if (a.app.changeId === b.app.changeId || b.p === a.p) continue;
      const minutes = prefix[b.p] - prefix[a.p + 1];
      if (minutes >= threshold) continue;
      out.push(
        quickChangeSnag({
          characterId: charId,
          characterName: ix.charactersById.get(charId)?.name ?? charId,
          from: { appearance: a.app, sceneNumber: order[a.p].number, changeNumber: changeNo(a.app.changeId) },
          to: { appearance: b.app, sceneNumber: order[b.p].number, changeNumber: changeNo(b.app.changeId) },
          between: order
            .slice(a.p + 1, Math.min(b.p, a.p + 1 + 12))
            .map((s) => ({ sceneNumber: s.number, minutes: s.runningMinutes ?? null })),
          betweenCount: b.p - a.p - 1,
          unknownCount: unknownPrefix[b.p] - unknownPrefix[a.p + 1],
          minutes,
          threshold,
        }),
      );
    }
  }
  return out;
}
