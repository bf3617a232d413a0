import { useState, type FormEvent } from "react";
import {
  alterationTaskSchema,
  createTicketInputSchema,
  taskKindLabels,
  taskKinds,
  type AlterationTask,
  type TaskKind,
} from "@shared/schemas/workroom";
import { parseLength, formatLength, type LengthUnit } from "@shared/domain/units";
import { Button } from "@/components/ui/button";
import { InputField, SelectField, TextareaField, controlClass } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/feedback";
import { ApiError } from "@/lib/api-client";
import { useRaiseTicket } from "../api/workroom";
import { TaskSafetyNotes } from "./safety";
import { fieldError, fieldErrorsOf } from "@/lib/form-errors";

interface TaskRow {
  kind: TaskKind;
  amount: string;
  note: string;
  distressStage: string;
}

const emptyRow = (): TaskRow => ({ kind: "take_in", amount: "", note: "", distressStage: "" });
const takesAmount = (k: TaskKind) => ["take_in", "let_out", "shorten", "lengthen", "re_hem"].includes(k);

/** Raise an alteration ticket on one garment: tasks with amounts in the production's unit, estimate, assignee. */
export function TicketForm(props: {
  productionId: string;
  garment: { id: string; label: string };
  fittingId?: string | null;
  units: LengthUnit;
  members: Array<{ id: string; name: string }>;
  onDone: () => void;
}) {
  const raise = useRaiseTicket(props.productionId);
  const [rows, setRows] = useState<TaskRow[]>([emptyRow()]);
  const [estimate, setEstimate] = useState("");
  const [assigneeId, setAssigneeId] = useState("");
  const [notes, setNotes] = useState("");
  const [errors, setErrors] = useState<Record<string, string>>({});

  const update = (i: number, patch: Partial<TaskRow>) => setRows((rs) => rs.map((r, j) => (j === i ? { ...r, ...patch } : r)));

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const errs: Record<string, string> = {};
    const tasks: AlterationTask[] = rows.map((r, i) => {
      let amountMm: number | null = null;
      if (r.amount.trim()) {
        const parsed = parseLength(r.amount, props.units);
        if (parsed.ok) amountMm = Math.abs(parsed.mm);
        else errs[`tasks.${i}.amountMm`] = fieldError(`tasks.${i}.amountMm`, parsed.reason);
      }
      const task = { kind: r.kind, amountMm, note: r.note.trim() || null, distressStage: r.distressStage ? Number(r.distressStage) : null };
      const check = alterationTaskSchema.safeParse(task);
      if (!check.success) Object.assign(errs, fieldErrorsOf(check.error, `tasks.${i}`));
      return task;
    });
    const input = {
      garmentId: props.garment.id,
      fittingId: props.fittingId ?? null,
      tasks,
      estimateHours: Number(estimate),
      assigneeId: assigneeId || null,
      notes: notes.trim() || null,
    };
    const parsed = createTicketInputSchema.safeParse(input);
    if (!parsed.success) for (const [k, m] of Object.entries(fieldErrorsOf(parsed.error))) errs[k] ??= m;
    setErrors(errs);
    if (Object.keys(errs).length) return;
    raise.mutate(parsed.data!, {
      onSuccess: () => props.onDone(),
      onError: (err) => err instanceof ApiError && setErrors(err.fields),
    });
  };

  return (
    <form
      onSubmit={submit}
      className="grid gap-3 rounded-md border border-ink-100 bg-chalk p-3"
      aria-label={`New alteration ticket for ${props.garment.label}`}
    >
      <p className="font-semibold text-ink">Alteration ticket · {props.garment.label}</p>
      {rows.map((r, i) => (
        <fieldset key={i} className="grid gap-2 rounded border border-chalk-200 bg-white p-2 sm:grid-cols-[10rem_8rem_1fr_auto]">
          <legend className="sr-only">Task {i + 1}</legend>
          <SelectField
            label={`Task ${i + 1}`}
            value={r.kind}
            onChange={(e) => update(i, { kind: e.target.value as TaskKind })}
            error={errors[`tasks.${i}.kind`]}
          >
            {taskKinds.map((k) => (
              <option key={k} value={k}>
                {taskKindLabels[k]}
              </option>
            ))}
          </SelectField>
          {r.kind === "distress" ? (
            <InputField
              label="To stage"
              type="number"
              min={1}
              max={10}
              value={r.distressStage}
              onChange={(e) => update(i, { distressStage: e.target.value })}
              error={errors[`tasks.${i}.distressStage`]}
            />
          ) : (
            <InputField
              label={`Amount (${props.units})`}
              inputMode="decimal"
              disabled={!takesAmount(r.kind)}
              value={r.amount}
              placeholder={takesAmount(r.kind) ? (props.units === "cm" ? "2.5" : "1 1/4") : "—"}
              onChange={(e) => update(i, { amount: e.target.value })}
              error={errors[`tasks.${i}.amountMm`]}
              hint={
                r.amount && parseLength(r.amount, props.units).ok
                  ? `= ${formatLength(Math.abs((parseLength(r.amount, props.units) as { mm: number }).mm), props.units)}`
                  : undefined
              }
            />
          )}
          <InputField label="Note" value={r.note} onChange={(e) => update(i, { note: e.target.value })} placeholder="where, how" />
          <div className="flex items-end">
            {rows.length > 1 && (
              <Button
                variant="ghost"
                size="sm"
                onClick={() => setRows((rs) => rs.filter((_, j) => j !== i))}
                aria-label={`Remove task ${i + 1}`}
              >
                Remove
              </Button>
            )}
          </div>
        </fieldset>
      ))}
      {errors.tasks && <p className="text-sm text-madder">{errors.tasks}</p>}
      <div>
        <Button variant="secondary" size="sm" onClick={() => setRows((rs) => [...rs, emptyRow()])}>
          Add a task
        </Button>
      </div>
      <TaskSafetyNotes kinds={rows.map((r) => r.kind)} />
      <div className="grid gap-3 sm:grid-cols-2">
        <InputField
          label="Estimated hours"
          inputMode="decimal"
          value={estimate}
          onChange={(e) => setEstimate(e.target.value.replace(",", "."))}
          error={errors.estimateHours}
        />
        <div className="flex flex-col gap-1">
          <label className="text-sm font-semibold text-ink-900" htmlFor="ticket-assignee">
            Who does it
          </label>
          <select
            id="ticket-assignee"
            className={controlClass}
            value={assigneeId}
            onChange={(e) => setAssigneeId(e.target.value)}
            aria-invalid={Boolean(errors.assigneeId)}
          >
            <option value="">Let the plan choose</option>
            {props.members.map((m) => (
              <option key={m.id} value={m.id}>
                {m.name}
              </option>
            ))}
          </select>
          {errors.assigneeId && <p className="text-sm text-madder">{errors.assigneeId}</p>}
        </div>
      </div>
      <TextareaField label="Notes" value={notes} onChange={(e) => setNotes(e.target.value)} />
      {raise.error && !(raise.error instanceof ApiError && Object.keys(raise.error.fields).length) && (
        <ErrorAlert error={raise.error} title="Ticket not raised" />
      )}
      <div className="flex gap-2">
        <Button type="submit" size="lg" busy={raise.isPending}>
          Raise ticket
        </Button>
        <Button variant="ghost" size="lg" onClick={props.onDone}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
