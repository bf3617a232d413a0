import { useState, type FormEvent } from "react";
import { intExtValues, type SceneDetailDto, type SceneInput } from "@shared/schemas/breakdown";
import { formatEighths, parseEighths } from "@shared/domain/breakdown";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { ErrorAlert } from "@/components/ui/feedback";
import { InputField, SelectField, TextareaField } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";
import { useDeleteScene, useUpdateScene } from "../api/breakdown";

const text = (v: string) => (v.trim() ? v.trim() : null);

/** Edits a scene's fields (number, set, I/E, time, story day and order, length, synopsis); delete asks first. */
export function SceneForm({
  productionId,
  scene,
  stage,
  onSaved,
  onDeleted,
}: {
  productionId: string;
  scene: SceneDetailDto;
  stage: boolean;
  onSaved?: () => void;
  onDeleted: () => void;
}) {
  const update = useUpdateScene(productionId, scene.id);
  const del = useDeleteScene(productionId);
  const [confirm, setConfirm] = useState(false);
  const initial = {
    number: scene.number,
    setName: scene.setName ?? "",
    intExt: scene.intExt ?? "",
    timeOfDay: scene.timeOfDay ?? "",
    storyDay: scene.storyDay == null ? "" : String(scene.storyDay),
    storyOrder: String(scene.storyOrder),
    length: stage
      ? scene.runningMinutes == null
        ? ""
        : String(scene.runningMinutes)
      : scene.lengthEighths == null
        ? ""
        : formatEighths(scene.lengthEighths),
    synopsis: scene.synopsis ?? "",
  };
  const [v, setV] = useState(initial);
  const [local, setLocal] = useState<Record<string, string>>({});
  const server = update.error instanceof ApiError ? update.error.fields : {};
  const fields = { ...server, ...local };
  const dirty = JSON.stringify(v) !== JSON.stringify(initial);
  const appearances = scene.appearances.length;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const errs: Record<string, string> = {};
    let length: Partial<SceneInput> = {};
    if (stage) {
      const m = Number(v.length);
      if (v.length.trim() && (!Number.isFinite(m) || m < 0 || m > 600)) errs.runningMinutes = "Running time is minutes between 0 and 600.";
      else length = { runningMinutes: v.length.trim() ? m : null };
    } else {
      const e8 = v.length.trim() ? parseEighths(v.length) : null;
      if (v.length.trim() && e8 === null) errs.lengthEighths = "Write the length in eighths of a page: 3/8, 1 or 1 3/8.";
      else length = { lengthEighths: e8 };
    }
    if (v.storyOrder.trim() === "" || !/^\d+$/.test(v.storyOrder.trim())) errs.storyOrder = "Story order is a whole number.";
    if (v.storyDay.trim() && !/^\d+$/.test(v.storyDay.trim())) errs.storyDay = "Story day is a whole number from 1.";
    setLocal(errs);
    if (Object.keys(errs).length) return;
    update.mutate(
      {
        number: v.number,
        setName: text(v.setName),
        intExt: (v.intExt || null) as SceneInput["intExt"],
        timeOfDay: text(v.timeOfDay),
        storyDay: v.storyDay.trim() ? Number(v.storyDay) : null,
        storyOrder: Number(v.storyOrder),
        synopsis: text(v.synopsis),
        ...length,
      },
      { onSuccess: () => onSaved?.() },
    );
  };

  return (
    <form onSubmit={submit} aria-label={`Edit scene ${scene.number}`} className="grid grid-cols-2 gap-3 sm:grid-cols-4">
      <InputField
        label="Scene number"
        required
        value={v.number}
        onChange={(e) => setV({ ...v, number: e.target.value })}
        error={fields.number}
      />
      <InputField
        label="Set or location"
        value={v.setName}
        onChange={(e) => setV({ ...v, setName: e.target.value })}
        error={fields.setName}
      />
      <SelectField label="I/E" value={v.intExt} onChange={(e) => setV({ ...v, intExt: e.target.value })} error={fields.intExt}>
        <option value="">—</option>
        {intExtValues.map((x) => (
          <option key={x}>{x}</option>
        ))}
      </SelectField>
      <InputField
        label="Time of day"
        value={v.timeOfDay}
        placeholder="DAY, NIGHT, DAWN…"
        onChange={(e) => setV({ ...v, timeOfDay: e.target.value })}
        error={fields.timeOfDay}
      />
      <InputField
        label="Story day"
        inputMode="numeric"
        value={v.storyDay}
        onChange={(e) => setV({ ...v, storyDay: e.target.value })}
        error={fields.storyDay}
      />
      <InputField
        label={stage ? "Running order" : "Story order"}
        inputMode="numeric"
        required
        value={v.storyOrder}
        onChange={(e) => setV({ ...v, storyOrder: e.target.value })}
        error={fields.storyOrder}
      />
      {stage ? (
        <InputField
          label="Running time (minutes)"
          inputMode="decimal"
          value={v.length}
          onChange={(e) => setV({ ...v, length: e.target.value })}
          error={fields.runningMinutes}
        />
      ) : (
        <InputField
          label="Pages"
          placeholder="1 3/8"
          value={v.length}
          onChange={(e) => setV({ ...v, length: e.target.value })}
          error={fields.lengthEighths}
          hint="in eighths: 3/8, 1, 1 3/8"
        />
      )}
      <TextareaField
        className="col-span-2 sm:col-span-4"
        label="Synopsis"
        value={v.synopsis}
        onChange={(e) => setV({ ...v, synopsis: e.target.value })}
        error={fields.synopsis}
      />
      {update.error && !Object.keys(server).length && <ErrorAlert error={update.error} title="Not saved" />}
      {update.isSuccess && !dirty && (
        <p role="status" className="col-span-2 self-center text-sm text-ink sm:col-span-4">
          Saved.
        </p>
      )}
      <div className="col-span-2 flex flex-wrap gap-2 sm:col-span-4">
        <Button type="submit" disabled={!dirty} busy={update.isPending}>
          Save scene
        </Button>
        <Button variant="ghost" className="text-madder" onClick={() => setConfirm(true)}>
          Delete scene
        </Button>
      </div>
      {del.error && <ErrorAlert error={del.error} title="Not deleted" />}
      <ConfirmDialog
        open={confirm}
        title={`Delete scene ${scene.number}?`}
        confirmLabel="Delete scene"
        danger
        busy={del.isPending}
        onCancel={() => setConfirm(false)}
        onConfirm={() =>
          del.mutate(scene.id, {
            onSuccess: () => {
              setConfirm(false);
              onDeleted();
            },
            onError: () => setConfirm(false),
          })
        }
      >
        {appearances ? `Its ${appearances} character${appearances === 1 ? "" : "s"} with their changes and states, ` : ""}every continuity
        entry and photo logged for it, and its place on {scene.shootDays.length} shoot day{scene.shootDays.length === 1 ? "" : "s"} are
        deleted too. This cannot be undone.
      </ConfirmDialog>
    </form>
  );
}
