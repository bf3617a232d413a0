// Continuity breaks, judged in story order:
//  1. within one story day a character keeps one change unless the breakdown marks a change;
//  2. for one garment copy the distress stage never goes down (distress is irreversible).
import type { AppearanceRec, JsonValue, SnagDraft, SnapshotIndex } from "./types";
import type { GroupPlan } from "./multiples";

const cmpStr = (a: string, b: string): number => (a < b ? -1 : a > b ? 1 : 0);

/** Facts for a change inside one story day without a marked change. */
export interface ChangeBreakFacts {
  characterName: string;
  storyDay: number;
  prev: { appearance: AppearanceRec; sceneNumber: string; changeNumber: string };
  cur: { appearance: AppearanceRec; sceneNumber: string; changeNumber: string };
}

/** The snag for an unmarked change within one story day. */
export function changeBreakSnag(f: ChangeBreakFacts): SnagDraft {
  const { prev, cur } = f;
  const evidence: { [k: string]: JsonValue } = {
    storyDay: f.storyDay,
    prevAppearanceId: prev.appearance.id,
    prevChangeId: prev.appearance.changeId,
    changeId: cur.appearance.changeId,
  };
  return {
    key: `continuity:change:${cur.appearance.id}`,
    kind: "continuity",
    severity: "warning",
    title: `${f.characterName}: change ${prev.changeNumber} \u2192 ${cur.changeNumber} within story day ${f.storyDay}`,
    explanation:
      `Story day ${f.storyDay}: ${f.characterName} wears change ${prev.changeNumber} in scene ${prev.sceneNumber} ` +
      `and change ${cur.changeNumber} in scene ${cur.sceneNumber}, but the breakdown marks no change in scene ${cur.sceneNumber}.`,
    subject: {
      characterId: cur.appearance.characterId,
      sceneIds: [prev.appearance.sceneId, cur.appearance.sceneId],
      appearanceIds: [prev.appearance.id, cur.appearance.id],
    },
    evidence,
  };
}

/** Rule 1: unmarked change within a story day, per character in story order. */
export function changeBreakSnags(ix: SnapshotIndex): SnagDraft[] {
  const byChar = new Map<string, { app: AppearanceRec; order: number; day: number }[]>();
  for (const app of ix.snapshot.appearances) {
    const sc = ix.scenesById.get(app.sceneId);
    if (!sc) continue;
    let list = byChar.get(app.characterId);
    if (!list) byChar.set(app.characterId, (list = []));
    list.push({ app, order: sc.storyOrder, day: sc.storyDay });
  }
  const out: SnagDraft[] = [];
  for (const [charId, list] of byChar) {
    list.sort((a, b) => a.order - b.order || cmpStr(a.app.sceneId, b.app.sceneId) || cmpStr(a.app.id, b.app.id));
    const name = ix.charactersById.get(charId)?.name ?? charId;
    for (let i = 1; i < list.length; i++) {
      const p = list[i - 1];
      const c = list[i];
      if (p.day !== c.day || p.app.changeId === c.app.changeId || c.app.changeHere) continue;
      out.push(
        changeBreakSnag({
          characterName: name,
          storyDay: c.day,
          prev: { appearance: p.app, sceneNumber: sceneNo(ix, p.app.sceneId), changeNumber: changeNo(ix, p.app.changeId) },
          cur: { appearance: c.app, sceneNumber: sceneNo(ix, c.app.sceneId), changeNumber: changeNo(ix, c.app.changeId) },
        }),
      );
    }
  }
  return out;
}

function sceneNo(ix: SnapshotIndex, id: string): string {
  return ix.scenesById.get(id)?.number ?? id;
}
function changeNo(ix: SnapshotIndex, id: string): string {
  const c = ix.changesById.get(id);
  return c ? String(c.number) : id;
}

/** One known or planned wearing of a garment copy. */
export interface CopyRecord {
  /** Garment id, or `${groupId}#${copy}` for a planned copy the group does not hold yet. */
  copyId: string;
  garmentId: string | null;
  groupId: string | null;
  /** `entry:<id>` for a continuity entry, `app:<id>` for a planned use. */
  recordId: string;
  appearanceId: string;
  characterId: string;
  sceneId: string;
  storyOrder: number;
  /** Tie-break inside one scene: the date it was shot ("" when planned). */
  date: string;
  stage: number;
}

/** Order records of one copy in story order (then date, then record id). */
export function compareRecords(a: CopyRecord, b: CopyRecord): number {
  return a.storyOrder - b.storyOrder || cmpStr(a.sceneId, b.sceneId) || cmpStr(a.date, b.date) || cmpStr(a.recordId, b.recordId);
}

/** The snag for a copy whose distress goes down in story order. */
export function distressBreakSnag(prev: CopyRecord, cur: CopyRecord, copyLabel: string, sceneNumber: (id: string) => string): SnagDraft {
  const evidence: { [k: string]: JsonValue } = {
    copyId: cur.copyId,
    from: { recordId: prev.recordId, sceneId: prev.sceneId, stage: prev.stage },
    to: { recordId: cur.recordId, sceneId: cur.sceneId, stage: cur.stage },
  };
  return {
    key: `continuity:distress:${cur.copyId}:${prev.recordId}:${cur.recordId}`,
    kind: "continuity",
    severity: "warning",
    title: `${copyLabel}: distress goes back from stage ${prev.stage} to ${cur.stage}`,
    explanation:
      `In story order ${copyLabel} is at distress stage ${prev.stage} in scene ${sceneNumber(prev.sceneId)} ` +
      `and at stage ${cur.stage} in scene ${sceneNumber(cur.sceneId)}, later in the story; distress cannot be undone, ` +
      `so the later scene needs another copy or the breakdown needs a change.`,
    subject: {
      characterId: cur.characterId,
      ...(cur.garmentId ? { garmentId: cur.garmentId } : {}),
      ...(cur.groupId ? { groupId: cur.groupId } : {}),
      sceneIds: [prev.sceneId, cur.sceneId],
      appearanceIds: [prev.appearanceId, cur.appearanceId],
    },
    evidence,
  };
}

/** Label for a copy in plain words ("J-014 Tweed jacket" or "copy #3 of “Hero coat”"). */
export function copyLabelOf(ix: SnapshotIndex, r: CopyRecord): string {
  if (r.garmentId) {
    const g = ix.garmentsById.get(r.garmentId);
    if (g) return `${g.tagCode} ${g.name}`;
  }
  if (r.groupId) {
    const name = ix.groupsById.get(r.groupId)?.name ?? r.groupId;
    return `copy #${r.copyId.slice(r.copyId.lastIndexOf("#") + 1)} of \u201c${name}\u201d`;
  }
  return r.copyId;
}

/**
 * Copy records kept as columns (one array per field, no object per record). A full recompute makes
 * tens of thousands of records that live only for this rule; as objects they outgrow the young
 * generation at production scale and get promoted, which made this step grow faster than the data.
 */
export class CopyRecordTable {
  readonly copyId: string[] = [];
  readonly garmentId: (string | null)[] = [];
  readonly groupId: (string | null)[] = [];
  /** 1 for a continuity entry (`entry:<id>`), 0 for a planned use (`app:<id>`). */
  readonly isEntry: number[] = [];
  /** The entry or appearance id without its prefix. */
  readonly rawId: string[] = [];
  readonly appearanceId: string[] = [];
  readonly characterId: string[] = [];
  readonly sceneId: string[] = [];
  readonly storyOrder: number[] = [];
  readonly date: string[] = [];
  readonly stage: number[] = [];

  get length(): number {
    return this.copyId.length;
  }

  add(
    copyId: string,
    garmentId: string | null,
    groupId: string | null,
    isEntry: number,
    rawId: string,
    appearanceId: string,
    characterId: string,
    sceneId: string,
    storyOrder: number,
    date: string,
    stage: number,
  ): void {
    this.copyId.push(copyId);
    this.garmentId.push(garmentId);
    this.groupId.push(groupId);
    this.isEntry.push(isEntry);
    this.rawId.push(rawId);
    this.appearanceId.push(appearanceId);
    this.characterId.push(characterId);
    this.sceneId.push(sceneId);
    this.storyOrder.push(storyOrder);
    this.date.push(date);
    this.stage.push(stage);
  }

  /** Record i as an object. */
  record(i: number): CopyRecord {
    return {
      copyId: this.copyId[i],
      garmentId: this.garmentId[i],
      groupId: this.groupId[i],
      recordId: `${this.isEntry[i] ? "entry" : "app"}:${this.rawId[i]}`,
      appearanceId: this.appearanceId[i],
      characterId: this.characterId[i],
      sceneId: this.sceneId[i],
      storyOrder: this.storyOrder[i],
      date: this.date[i],
      stage: this.stage[i],
    };
  }

  /** compareRecords on two rows, then row order (so the sort needs no stability). "app:" sorts before "entry:". */
  compare(a: number, b: number): number {
    return (
      this.storyOrder[a] - this.storyOrder[b] ||
      cmpStr(this.sceneId[a], this.sceneId[b]) ||
      cmpStr(this.date[a], this.date[b]) ||
      this.isEntry[a] - this.isEntry[b] ||
      cmpStr(this.rawId[a], this.rawId[b]) ||
      a - b
    );
  }
}

/** Every copy record: continuity entries first-hand; otherwise direct change items and the multiples plan.
 * A (copy, record) pair may appear more than once (same data); distressBreakSnags drops the repeats. */
export function copyRecordTable(ix: SnapshotIndex, plans: GroupPlan[]): CopyRecordTable {
  const t = new CopyRecordTable();
  const dateOfRun = new Map<string, string>();
  for (const d of ix.snapshot.shootDays) dateOfRun.set(d.id, d.date);
  for (const p of ix.snapshot.performances ?? []) dateOfRun.set(p.id, p.date);
  for (const { entry, appearance } of ix.resolvedEntries) {
    const sc = ix.scenesById.get(appearance.sceneId);
    if (!sc) continue;
    const date = dateOfRun.get(entry.shootDayId) ?? "";
    const stage = entry.distressStage ?? appearance.distressStage;
    for (const gid of entry.garmentIds) {
      const g = ix.garmentsById.get(gid);
      t.add(
        gid,
        gid,
        g?.multiplesGroupId ?? null,
        1,
        entry.id,
        appearance.id,
        appearance.characterId,
        appearance.sceneId,
        sc.storyOrder,
        date,
        stage,
      );
    }
  }
  for (const app of ix.snapshot.appearances) {
    if (ix.appearancesWithEntries.has(app.id)) continue;
    const sc = ix.scenesById.get(app.sceneId);
    if (!sc) continue;
    for (const item of ix.itemsByChange.get(app.changeId) ?? []) {
      if (!item.garmentId) continue;
      const g = ix.garmentsById.get(item.garmentId);
      t.add(
        item.garmentId,
        item.garmentId,
        g?.multiplesGroupId ?? null,
        0,
        app.id,
        app.id,
        app.characterId,
        app.sceneId,
        sc.storyOrder,
        "",
        app.distressStage,
      );
    }
  }
  for (const plan of plans) {
    for (let i = 0; i < plan.demands.length; i++) {
      const d = plan.demands[i];
      if (ix.appearancesWithEntries.has(d.appearanceId)) continue;
      const sc = ix.scenesById.get(d.sceneId);
      if (!sc) continue;
      const c = plan.copyOf[i];
      const garmentId = plan.copyIds[c] ?? null;
      t.add(
        garmentId ?? `${plan.groupId}#${c + 1}`,
        garmentId,
        plan.groupId,
        0,
        d.appearanceId,
        d.appearanceId,
        d.characterId,
        d.sceneId,
        sc.storyOrder,
        "",
        d.level,
      );
    }
  }
  return t;
}

/** All copy records as objects (see copyRecordTable). */
export function copyRecords(ix: SnapshotIndex, plans: GroupPlan[]): CopyRecord[] {
  const t = copyRecordTable(ix, plans);
  const out: CopyRecord[] = [];
  for (let i = 0; i < t.length; i++) out.push(t.record(i));
  return out;
}

/** Rule 2: distress going down in story order for one copy. Rows are bucketed by copy with a
 * counting sort and each bucket sorted in place; objects are built only for the rows of a snag. */
export function distressBreakSnags(ix: SnapshotIndex, plans: GroupPlan[]): SnagDraft[] {
  const t = copyRecordTable(ix, plans);
  const n = t.length;
  const copyNo = new Map<string, number>();
  const noOf = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    let k = copyNo.get(t.copyId[i]);
    if (k === undefined) copyNo.set(t.copyId[i], (k = copyNo.size));
    noOf[i] = k;
  }
  const starts = new Int32Array(copyNo.size + 1);
  for (let i = 0; i < n; i++) starts[noOf[i] + 1]++;
  for (let k = 0; k < copyNo.size; k++) starts[k + 1] += starts[k];
  const fill = starts.slice(0, copyNo.size);
  const order = new Int32Array(n);
  for (let i = 0; i < n; i++) order[fill[noOf[i]]++] = i;
  const cmp = (a: number, b: number) => t.compare(a, b);
  const num = (id: string) => sceneNo(ix, id);
  const out: SnagDraft[] = [];
  for (let k = 0; k < copyNo.size; k++) {
    const from = starts[k];
    const to = starts[k + 1];
    if (to - from < 2) continue;
    order.subarray(from, to).sort(cmp);
    // Repeats of one record (same copy, same record id) sort next to each other and carry the same stage.
    let prev = -1;
    for (let j = from; j < to; j++) {
      const cur = order[j];
      if (prev >= 0 && t.isEntry[cur] === t.isEntry[prev] && t.rawId[cur] === t.rawId[prev]) continue;
      if (prev >= 0 && t.stage[cur] < t.stage[prev]) {
        const c = t.record(cur);
        out.push(distressBreakSnag(t.record(prev), c, copyLabelOf(ix, c), num));
      }
      prev = cur;
    }
  }
  return out;
}

/** All continuity snags. */
export function continuitySnags(ix: SnapshotIndex, plans: GroupPlan[]): SnagDraft[] {
  return [...changeBreakSnags(ix), ...distressBreakSnags(ix, plans)];
}
