import { useState } from "react";
import { Link } from "react-router-dom";
import type { SceneDetailDto } from "@shared/schemas/breakdown";
import type { CharacterDto } from "@shared/schemas/cast";
import type { ChangeDto } from "@shared/schemas/changes";
import { formatEighths } from "@shared/domain/breakdown";
import { Badge, ErrorAlert, SafetyNote } from "@/components/ui/feedback";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { controlClass } from "@/components/ui/field";
import { PhotoStrip } from "@/components/photos";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { useContinuityEntries, useCreateAppearance, useDeleteAppearance, useUpdateAppearance } from "../api/breakdown";
import { formatDate } from "@shared/format";

type App = SceneDetailDto["appearances"][number];

/** Flags of an appearance as badges. */
export function StateBadges({
  a,
}: {
  a: { distressStage: number; wet: boolean; stunt: boolean; blood: boolean; vfxShot: boolean; changeHere: boolean };
}) {
  return (
    <span className="inline-flex flex-wrap gap-1">
      {a.distressStage > 0 && <Badge tone="warning">distress {a.distressStage}</Badge>}
      {a.wet && <Badge tone="note">wet</Badge>}
      {a.stunt && <Badge tone="blocking">stunt</Badge>}
      {a.blood && <Badge tone="blocking">blood</Badge>}
      {a.vfxShot && <Badge>vfx shot</Badge>}
      {a.changeHere && <Badge tone="note">change in scene</Badge>}
    </span>
  );
}

/** A scene: its shoot days, each character with the change worn and the state, and continuity logged. */
export function ScenePage({
  productionId,
  scene,
  characters,
  changes,
  canEdit,
  stage,
  characterHref,
}: {
  productionId: string;
  scene: SceneDetailDto;
  characters: CharacterDto[];
  changes: ChangeDto[];
  canEdit: boolean;
  stage: boolean;
  characterHref: (id: string) => string;
}) {
  const continuity = useContinuityEntries(productionId, { sceneId: scene.id });
  const create = useCreateAppearance(productionId);
  const update = useUpdateAppearance(productionId);
  const remove = useDeleteAppearance(productionId);
  const [adding, setAdding] = useState("");
  const [removing, setRemoving] = useState<App | null>(null);
  const present = new Set(scene.appearances.map((a) => a.characterId));
  const risky = scene.appearances.some((a) => a.wet || a.stunt || a.blood);
  return (
    <div className="grid gap-4">
      <dl className="grid grid-cols-2 gap-x-4 gap-y-1 text-sm sm:grid-cols-4">
        <div>
          <dt className="text-slate">Set</dt>
          <dd>
            {scene.setName ?? "—"} {scene.intExt ? `(${scene.intExt})` : ""}
          </dd>
        </div>
        <div>
          <dt className="text-slate">Time · story day</dt>
          <dd>
            {scene.timeOfDay ?? "—"} · {scene.storyDay ?? "—"}
          </dd>
        </div>
        <div>
          <dt className="text-slate">{stage ? "Running time" : "Length"}</dt>
          <dd>
            {stage
              ? `${scene.runningMinutes ?? "?"} min`
              : scene.lengthEighths != null
                ? `${formatEighths(scene.lengthEighths)} pages`
                : "—"}
          </dd>
        </div>
        <div>
          <dt className="text-slate">{stage ? "Running order" : scheduleLabels("film").Days}</dt>
          <dd>
            {stage
              ? scene.storyOrder
              : scene.shootDays.map((d) => `${scheduleLabels("film").numbered(d.dayNumber)} (${formatDate(d.date)})`).join(", ") ||
                "not scheduled"}
          </dd>
        </div>
      </dl>
      {scene.synopsis && <p className="text-sm text-ink-900">{scene.synopsis}</p>}
      {risky && (
        <SafetyNote>
          This scene has wet, stunt or blood work: check fabric and fastenings with the stunt coordinator, keep dry changes and warm layers
          ready, and use only approved stage blood on approved fabrics.
        </SafetyNote>
      )}
      <section aria-label="Characters in this scene" className="grid gap-2">
        <h2 className="font-semibold text-ink">Characters and changes</h2>
        <ul className="grid gap-2">
          {scene.appearances.map((a) => (
            <AppearanceRow
              key={a.id}
              a={a}
              changes={changes.filter((c) => c.characterId === a.characterId)}
              canEdit={canEdit}
              stage={stage}
              characterHref={characterHref}
              onSave={(input) => update.mutate({ id: a.id, input })}
              onRemove={() => setRemoving(a)}
            />
          ))}
        </ul>
        {update.error && <ErrorAlert error={update.error} title="Not saved" />}
        {remove.error && <ErrorAlert error={remove.error} title="Not removed" />}
        <ConfirmDialog
          open={Boolean(removing)}
          title={`Take ${removing?.characterName ?? ""} out of scene ${scene.number}?`}
          confirmLabel="Take out of scene"
          danger
          busy={remove.isPending}
          onCancel={() => setRemoving(null)}
          onConfirm={() => removing && remove.mutate(removing.id, { onSettled: () => setRemoving(null) })}
        >
          The change worn here, the distress stage and the wet, stunt, blood and effects flags of this appearance are deleted. Continuity
          already logged stays.
        </ConfirmDialog>
        {canEdit && (
          <div className="flex flex-wrap items-end gap-2">
            <label className="grid gap-1 text-sm font-semibold">
              Add a character
              <select className={controlClass} value={adding} onChange={(e) => setAdding(e.target.value)}>
                <option value="">Choose…</option>
                {characters
                  .filter((c) => !present.has(c.id))
                  .map((c) => (
                    <option key={c.id} value={c.id}>
                      {c.name}
                    </option>
                  ))}
              </select>
            </label>
            <Button
              disabled={!adding}
              busy={create.isPending}
              onClick={() =>
                create.mutate(
                  { sceneId: scene.id, characterId: adding, changeId: changes.find((c) => c.characterId === adding)?.id ?? null },
                  { onSuccess: () => setAdding("") },
                )
              }
            >
              Add
            </Button>
            {create.error && <ErrorAlert error={create.error} />}
          </div>
        )}
      </section>
      <section aria-label="Continuity for this scene" className="grid gap-2">
        <h2 className="font-semibold text-ink">Continuity logged</h2>
        {continuity.data?.length ? (
          <ul className="grid gap-3">
            {continuity.data.map((e) => (
              <li key={e.id} className="rounded border border-chalk-200 p-2">
                <p className="text-sm font-semibold">{e.characterName}</p>
                {e.notes && <p className="text-sm">{e.notes}</p>}
                <PhotoStrip photos={e.photos} size="sm" label={`Photos of ${e.characterName}`} />
              </li>
            ))}
          </ul>
        ) : (
          <p className="text-sm text-slate">Nothing logged for this scene yet.</p>
        )}
      </section>
    </div>
  );
}

function AppearanceRow({
  a,
  changes,
  canEdit,
  stage,
  characterHref,
  onSave,
  onRemove,
}: {
  a: App;
  changes: ChangeDto[];
  canEdit: boolean;
  stage: boolean;
  characterHref: (id: string) => string;
  onSave: (input: Record<string, unknown>) => void;
  onRemove: () => void;
}) {
  return (
    <li className="grid gap-2 rounded border border-chalk-200 bg-white p-2 sm:grid-cols-[1fr_auto] sm:items-center">
      <div className="grid gap-1">
        <div className="flex flex-wrap items-center gap-2">
          <Link to={characterHref(a.characterId)} className="font-semibold text-ink underline-offset-2 hover:underline">
            {a.characterName}
          </Link>
          <span className="text-sm">
            {a.change ? `Change ${a.change.number}${a.change.description ? `: ${a.change.description}` : ""}` : "No change set"}
          </span>
          <StateBadges a={a} />
          {stage && a.minutesSincePreviousExit != null && (
            <Badge tone={a.minutesSincePreviousExit < 2 ? "warning" : "neutral"}>{a.minutesSincePreviousExit} min since last exit</Badge>
          )}
        </div>
      </div>
      {canEdit && (
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <label className="flex items-center gap-1">
            <span className="sr-only">Change for {a.characterName}</span>
            <select
              className={`${controlClass} w-auto py-1`}
              value={a.changeId ?? ""}
              onChange={(e) => onSave({ changeId: e.target.value || null })}
              aria-label={`Change for ${a.characterName}`}
            >
              <option value="">none</option>
              {changes.map((c) => (
                <option key={c.id} value={c.id}>
                  {c.number}
                </option>
              ))}
            </select>
          </label>
          <label className="flex items-center gap-1">
            Distress
            <input
              type="number"
              min={0}
              max={10}
              className={`${controlClass} w-16 py-1`}
              defaultValue={a.distressStage}
              onBlur={(e) => Number(e.target.value) !== a.distressStage && onSave({ distressStage: Number(e.target.value) })}
              aria-label={`Distress stage for ${a.characterName}`}
            />
          </label>
          {(["wet", "stunt", "blood", "vfxShot", "changeHere"] as const).map((f) => (
            <label key={f} className="flex items-center gap-1">
              <input type="checkbox" checked={a[f]} onChange={(e) => onSave({ [f]: e.target.checked })} />
              {f === "vfxShot" ? "vfx" : f === "changeHere" ? "change here" : f}
            </label>
          ))}
          <Button size="sm" variant="ghost" onClick={onRemove}>
            Remove
          </Button>
        </div>
      )}
    </li>
  );
}
