import { useEffect, useMemo, useRef, useState } from "react";
import { Link, Route, Routes, useParams } from "react-router-dom";
import type { ContinuityTimelineDto } from "@shared/schemas/continuity";
import type { PhotoView } from "@shared/schemas/photos";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { formatClockTime, formatDate } from "@shared/format";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { SelectField, TextareaField, InputField } from "@/components/ui/field";
import { ErrorAlert, Spinner, EmptyState, SafetyNote } from "@/components/ui/feedback";
import { PhotoCapture, PhotoStrip, viewLabels, type PendingPhoto } from "@/components/photos";
import { useCharacters, useContinuityTimeline, useScene, useShootDays } from "@/features/breakdown/api/breakdown";
import { StateBadges } from "@/features/breakdown/components/scene-page";
import { cn } from "@/utils/cn";
import { useMe } from "@/features/auth/api/auth";
import { OfflineStamp } from "@/components/offline";
import { useOfflineQueue } from "@/lib/offline/hooks";
import { enqueue } from "@/lib/offline/queue";
import { queueRunner } from "@/lib/offline/runner";
import { reducePhoto } from "@/lib/offline/reduce-photo";
import { newClientId } from "@/lib/offline/client-id";
import { scheduleLabels } from "@shared/domain/schedule-labels";

/** Continuity screen: capture on set, a character's timeline, two scenes side by side. */
export default function ContinuityScreen() {
  return (
    <Routes>
      <Route path="timeline/:characterId" element={<TimelineRoute />} />
      <Route path="*" element={<ContinuityHome />} />
    </Routes>
  );
}

const VIEW_ORDER: PhotoView[] = ["front", "back", "left", "right", "detail"];

function ContinuityHome() {
  const { productionId, production, can, today } = useCurrentProduction();
  const days = useShootDays(productionId);
  const characters = useCharacters(productionId);
  const me = useMe();
  const [dayId, setDayId] = useState("");
  const [sceneId, setSceneId] = useState("");
  const [characterId, setCharacterId] = useState("");
  const words = scheduleLabels(production);

  // Default to today's shoot day, else the next one, else the last (chosen while rendering, once the days are in).
  if (!dayId && days.data?.length && today) {
    const pick = days.data.find((d) => d.date === today) ?? days.data.find((d) => d.date > today) ?? days.data[days.data.length - 1]!;
    setDayId(pick.id);
  }
  const day = days.data?.find((d) => d.id === dayId);

  return (
    <div className="grid gap-4">
      <PageHeader
        title="Continuity"
        subtitle={can("continuity.log") ? "Log what was worn, with photos, in a few taps" : "What was worn, scene by scene"}
      />
      {can("continuity.log") && (
        <Card className="grid gap-4">
          {me.data && production && <OfflineStamp userId={me.data.id} productionId={productionId} timeZone={production.timeZone} />}
          {days.isPending ? (
            <Spinner />
          ) : !days.data?.length ? (
            <EmptyState title={words.none} />
          ) : (
            <SelectField
              label={words.Day}
              value={dayId}
              onChange={(e) => {
                setDayId(e.target.value);
                setSceneId("");
                setCharacterId("");
              }}
            >
              {days.data.map((d) => (
                <option key={d.id} value={d.id}>
                  {d.date === today ? "Today · " : ""}
                  {scheduleLabels(d.kind === "performance" ? "stage" : "film").numbered(d.dayNumber)} · {formatDate(d.date)}
                  {d.startsAt ? ` ${formatClockTime(d.startsAt)}` : ""}
                </option>
              ))}
            </SelectField>
          )}
          {day && (
            <fieldset>
              <legend className="mb-1 text-sm font-semibold text-ink-900">Scene</legend>
              <div className="grid grid-cols-3 gap-2 sm:grid-cols-6">
                {day.scenes.map((s) => (
                  <button
                    key={s.id}
                    type="button"
                    aria-pressed={sceneId === s.id}
                    onClick={() => {
                      setSceneId(s.id);
                      setCharacterId("");
                    }}
                    className={cn(
                      "min-h-12 rounded-md border px-2 text-base font-semibold",
                      sceneId === s.id ? "border-ink bg-ink text-chalk" : "border-ink-100 bg-white text-ink",
                    )}
                  >
                    Sc {s.number}
                  </button>
                ))}
              </div>
            </fieldset>
          )}
          {sceneId && <CharacterPicker productionId={productionId} sceneId={sceneId} characterId={characterId} onPick={setCharacterId} />}
          {sceneId && characterId && (
            <CaptureForm
              key={`${sceneId}:${characterId}`}
              productionId={productionId}
              shootDayId={dayId}
              sceneId={sceneId}
              characterId={characterId}
              label={`Scene ${day?.scenes.find((s) => s.id === sceneId)?.number ?? "?"} · ${characters.data?.find((c) => c.id === characterId)?.name ?? "character"}`}
              onDone={() => setCharacterId("")}
            />
          )}
        </Card>
      )}
      <Card>
        <h2 className="mb-2 font-semibold text-ink">Timelines</h2>
        <ul className="grid grid-cols-1 gap-1 sm:grid-cols-2">
          {characters.data?.map((c) => (
            <li key={c.id}>
              <Link
                className="block min-h-11 rounded px-2 py-2 font-semibold text-ink hover:bg-ink-50"
                to={`/p/${productionId}/continuity/timeline/${c.id}`}
              >
                {c.name}
              </Link>
            </li>
          ))}
        </ul>
      </Card>
    </div>
  );
}

function CharacterPicker({
  productionId,
  sceneId,
  characterId,
  onPick,
}: {
  productionId: string;
  sceneId: string;
  characterId: string;
  onPick: (id: string) => void;
}) {
  const scene = useScene(productionId, sceneId);
  if (scene.isPending) return <Spinner />;
  if (scene.error) return <ErrorAlert error={scene.error} />;
  return (
    <fieldset>
      <legend className="mb-1 text-sm font-semibold text-ink-900">Character</legend>
      <div className="grid gap-2 sm:grid-cols-2">
        {scene.data.appearances.map((a) => (
          <button
            key={a.id}
            type="button"
            aria-pressed={characterId === a.characterId}
            onClick={() => onPick(a.characterId)}
            className={cn(
              "min-h-12 rounded-md border px-3 py-2 text-left",
              characterId === a.characterId ? "border-ink bg-ink text-chalk" : "border-ink-100 bg-white text-ink",
            )}
          >
            <span className="block font-semibold">{a.characterName}</span>
            <span className="text-sm">{a.change ? `Change ${a.change.number}` : "No change set"} </span>
            <StateBadges a={a} />
          </button>
        ))}
      </div>
      {scene.data.appearances.some((a) => a.wet || a.stunt || a.blood) && (
        <div className="mt-2">
          <SafetyNote>
            Wet, stunt or blood scene: keep a dry change and warm layers ready and follow the stunt coordinator on padding and fastenings.
          </SafetyNote>
        </div>
      )}
    </fieldset>
  );
}

function CaptureForm({
  productionId,
  shootDayId,
  sceneId,
  characterId,
  label,
  onDone,
}: {
  productionId: string;
  shootDayId: string;
  sceneId: string;
  characterId: string;
  label: string;
  onDone: () => void;
}) {
  const me = useMe();
  const queue = useOfflineQueue();
  const [photos, setPhotos] = useState<PendingPhoto[]>([]);
  const [notes, setNotes] = useState("");
  const [distress, setDistress] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<Error | null>(null);
  const [queuedId, setQueuedId] = useState<string | null>(null);
  const [sent, setSent] = useState(false);
  const [seenQueued, setSeenQueued] = useState(false);
  // Listening before the record is queued: with a good signal it can be stored before the next render.
  const pending = useRef<string | null>(null);
  useEffect(() => queueRunner.onSent((r) => r.clientId === pending.current && setSent(true)), []);
  useEffect(() => () => photos.forEach((p) => URL.revokeObjectURL(p.previewUrl)), [photos]);
  const nextView = VIEW_ORDER.find((v) => !photos.some((p) => p.view === v)) ?? "detail";
  // Every entry goes through the phone's queue (photos reduced first): with a signal it is sent at
  // once, without one it waits on the phone and goes when the signal is back.
  const save = async () => {
    const userId = me.data?.id;
    if (!userId) return;
    setBusy(true);
    setError(null);
    try {
      const reduced = await Promise.all(photos.map((p, i) => reducePhoto(p.file, p.view, i)));
      const clientId = newClientId();
      pending.current = clientId;
      await enqueue({
        clientId,
        userId,
        productionId,
        kind: "continuity",
        summary: `${label}${reduced.length ? ` · ${reduced.length} photo${reduced.length > 1 ? "s" : ""}` : ""}`,
        queuedAt: new Date().toISOString(),
        payload: { shootDayId, sceneId, characterId, notes, distressStage: distress },
        photos: reduced,
      });
      setQueuedId(clientId);
      setPhotos([]);
      setNotes("");
      queueRunner.kick(true);
    } catch (e) {
      // On failure everything stays on screen so nothing is lost; Save can be pressed again.
      setError(e instanceof Error ? e : new Error(String(e)));
    } finally {
      setBusy(false);
    }
  };
  if (queuedId) {
    const waiting = queue.items.find((i) => i.clientId === queuedId);
    if (waiting && !seenQueued) setSeenQueued(true);
    return (
      <div role="status" className="grid gap-2 rounded border border-ink-100 bg-ink-50 p-3">
        <p className="font-semibold text-ink">
          {sent
            ? "Saved."
            : !waiting
              ? seenQueued
                ? "Cancelled: not sent."
                : "Kept on this phone; sending…"
              : waiting.state === "held"
                ? `Kept on this phone, not accepted: ${waiting.lastError ?? ""}`
                : queue.online
                  ? "Kept on this phone; sending…"
                  : "Kept on this phone. It is sent when the signal is back."}
        </p>
        <div className="flex flex-wrap gap-2">
          <Link className="font-semibold text-ink underline" to={`/p/${productionId}/continuity/timeline/${characterId}`}>
            See the timeline
          </Link>
          <Button variant="secondary" onClick={onDone}>
            Log another character
          </Button>
        </div>
      </div>
    );
  }
  return (
    <div className="grid gap-3">
      <PhotoCapture nextView={nextView} onAdd={(list) => setPhotos((ps) => [...ps, ...list].slice(0, 8))} disabled={busy} />
      {photos.length > 0 && (
        <ul className="flex flex-wrap gap-2" aria-label="Photos to save">
          {photos.map((p) => (
            <li key={p.id} className="relative">
              <img src={p.previewUrl} alt={`${viewLabels[p.view]} (not saved yet)`} className="size-20 rounded object-cover" />
              <select
                aria-label="View of this photo"
                className="absolute bottom-0 left-0 w-full bg-ink/80 text-xs text-chalk"
                value={p.view}
                onChange={(e) => setPhotos((ps) => ps.map((x) => (x.id === p.id ? { ...x, view: e.target.value as PhotoView } : x)))}
              >
                {Object.entries(viewLabels).map(([v, l]) => (
                  <option key={v} value={v}>
                    {l}
                  </option>
                ))}
              </select>
              <button
                type="button"
                aria-label="Remove this photo"
                className="absolute -top-2 -right-2 size-6 rounded-full bg-madder text-xs text-white"
                onClick={() => setPhotos((ps) => ps.filter((x) => x.id !== p.id))}
              >
                ×
              </button>
            </li>
          ))}
        </ul>
      )}
      <TextareaField
        label="Notes"
        placeholder="collar open, left cuff rolled twice"
        value={notes}
        onChange={(e) => setNotes(e.target.value)}
      />
      <InputField
        label="Distress stage worn (optional)"
        type="number"
        min={0}
        max={10}
        inputMode="numeric"
        value={distress}
        onChange={(e) => setDistress(e.target.value)}
        className="max-w-48"
      />
      {error && <ErrorAlert error={error} title="Not saved; your notes and photos are still here" />}
      <Button size="lg" onClick={() => void save()} busy={busy} disabled={!photos.length && !notes.trim()}>
        Save continuity{photos.length ? ` (${photos.length} photo${photos.length > 1 ? "s" : ""})` : ""}
      </Button>
    </div>
  );
}

type TimelineScene = ContinuityTimelineDto["scenes"][number];

/** Two scenes side by side, as a modal over the timeline (it opens in view, and Close returns to the same place). */
function CompareDialog({ open, scenes, onClose }: { open: boolean; scenes: TimelineScene[]; onClose: () => void }) {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal?.();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      aria-labelledby="compare-title"
      className="m-auto max-h-[92dvh] w-[min(64rem,96vw)] overflow-y-auto rounded-lg border border-chalk-200 bg-white p-4 shadow-xl backdrop:bg-ink-900/40"
    >
      <div className="mb-2 flex items-center justify-between gap-2">
        <h2 id="compare-title" className="font-semibold text-ink">
          Side by side
        </h2>
        <Button variant="secondary" onClick={onClose} autoFocus>
          Close
        </Button>
      </div>
      <div className="grid grid-cols-2 gap-3" aria-label="Compare scenes">
        {scenes.map((s) => (
          <div key={s.sceneId} className="grid min-w-0 content-start gap-1">
            <p className="font-semibold">
              Scene {s.number} · story day {s.storyDay ?? "—"} · change {s.change?.number ?? "—"}
            </p>
            {s.entries.flatMap((e) => e.photos).length ? (
              s.entries
                .flatMap((e) => e.photos)
                .map((p) => (
                  <img
                    key={p.id}
                    src={p.urls.display}
                    alt={`Scene ${s.number}, ${viewLabels[p.view].toLowerCase()}`}
                    className="w-full rounded"
                  />
                ))
            ) : (
              <p className="text-sm text-slate">No photos.</p>
            )}
            {s.entries.map(
              (e) =>
                e.notes && (
                  <p key={e.id} className="text-sm">
                    {e.notes}
                  </p>
                ),
            )}
          </div>
        ))}
      </div>
    </dialog>
  );
}

function TimelineRoute() {
  const { characterId = "" } = useParams();
  const { productionId, production } = useCurrentProduction();
  const timeline = useContinuityTimeline(productionId, characterId);
  const [compare, setCompare] = useState<string[]>([]);
  const [showing, setShowing] = useState(false);
  const scenes = useMemo(() => timeline.data?.scenes ?? [], [timeline.data]);
  const picked = useMemo(
    () => compare.map((id) => scenes.find((s) => s.sceneId === id)).filter((s): s is TimelineScene => Boolean(s)),
    [compare, scenes],
  );
  if (timeline.isPending) return <Spinner />;
  if (timeline.error) return <ErrorAlert error={timeline.error} />;
  const toggle = (id: string) => {
    const next = compare.includes(id) ? compare.filter((x) => x !== id) : [...compare, id].slice(-2);
    setCompare(next);
    // The second pick opens the comparison over the page, where the person is scrolled to.
    if (next.length === 2 && !compare.includes(id)) setShowing(true);
  };
  return (
    <div className="grid grid-cols-1 gap-4">
      <PageHeader
        title={`${timeline.data.character.name}: continuity`}
        subtitle={<Link to={`/p/${productionId}/continuity`}>← Continuity</Link>}
      />
      <CompareDialog open={showing && picked.length === 2} scenes={picked} onClose={() => setShowing(false)} />
      {picked.length === 2 && !showing && (
        // Stays at the bottom of the screen, wherever the timeline is scrolled to.
        <div
          className="fixed inset-x-0 bottom-0 z-10 flex flex-wrap items-center justify-center gap-2 border-t border-chalk-200 bg-white/95 px-3 py-2 shadow-lg"
          role="region"
          aria-label="Scenes to compare"
        >
          <span className="text-sm text-ink-900">
            Scenes {picked[0]!.number} and {picked[1]!.number}
          </span>
          <Button onClick={() => setShowing(true)}>Side by side</Button>
          <Button variant="secondary" onClick={() => setCompare([])}>
            Clear
          </Button>
        </div>
      )}
      <ol className="grid gap-3" aria-label={production?.kind === "stage" ? "Running order" : "Story order"}>
        {scenes.map((s) => (
          <li key={s.sceneId}>
            <Card className="grid gap-2">
              <div className="flex flex-wrap items-center gap-2">
                <h2 className="font-semibold text-ink">Scene {s.number}</h2>
                <span className="text-sm text-slate">
                  story day {s.storyDay ?? "—"} · change {s.change?.number ?? "—"}
                </span>
                {s.distressStage > 0 && <span className="text-sm text-slate">· distress {s.distressStage}</span>}
                <label className="ml-auto flex min-h-11 items-center gap-1 text-sm">
                  <input type="checkbox" checked={compare.includes(s.sceneId)} onChange={() => toggle(s.sceneId)} /> Compare
                </label>
              </div>
              {s.entries.length === 0 ? (
                <p className="text-sm text-slate">Not logged yet.</p>
              ) : (
                s.entries.map((e) => (
                  <div key={e.id} className="grid gap-1">
                    {e.notes && <p className="text-sm">{e.notes}</p>}
                    <PhotoStrip photos={e.photos} label={`Scene ${s.number} photos`} />
                  </div>
                ))
              )}
            </Card>
          </li>
        ))}
      </ol>
    </div>
  );
}
