import { useState } from "react";
import { Link } from "react-router-dom";
import type { ChangeDto } from "@shared/schemas/changes";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { InputField, SelectField, controlClass } from "@/components/ui/field";
import { Badge, ErrorAlert, Spinner, EmptyState } from "@/components/ui/feedback";
import { ApiError } from "@/lib/api-client";
import { ConfirmDialog } from "@/components/ui/dialog";
import { useChanges, useCharacters, useCreateChange, useSetApproval, useUpdateChange } from "@/features/breakdown/api/breakdown";

const approvalTone = { draft: "neutral", proposed: "warning", approved: "note" } as const;

/** Changes screen: each character's numbered changes, their items, approval and scenes. */
export default function ChangesScreen() {
  const { productionId, can } = useCurrentProduction();
  const characters = useCharacters(productionId);
  const [characterId, setCharacterId] = useState("");
  const changes = useChanges(productionId, characterId || undefined);
  return (
    <div className="grid gap-4">
      <PageHeader title="Changes" subtitle="Each character's costume changes, what they are made of and where they play" />
      <Card>
        <SelectField label="Character" value={characterId} onChange={(e) => setCharacterId(e.target.value)} className="max-w-sm">
          <option value="">All characters</option>
          {characters.data?.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </SelectField>
      </Card>
      {changes.isPending ? (
        <Spinner />
      ) : changes.error ? (
        <ErrorAlert error={changes.error} />
      ) : changes.data.length === 0 ? (
        <EmptyState title="No changes yet" />
      ) : (
        <ul className="grid gap-3" aria-label="Changes">
          {changes.data.map((c) => (
            <li key={c.id}>
              <ChangeCard productionId={productionId} change={c} canEdit={can("change.update")} canApprove={can("change.approve")} />
            </li>
          ))}
        </ul>
      )}
      {can("change.update") && characterId && <NewChangeForm productionId={productionId} characterId={characterId} />}
    </div>
  );
}

function ChangeCard({
  productionId,
  change,
  canEdit,
  canApprove,
}: {
  productionId: string;
  change: ChangeDto;
  canEdit: boolean;
  canApprove: boolean;
}) {
  const approve = useSetApproval(productionId);
  const update = useUpdateChange(productionId);
  const [label, setLabel] = useState("");
  const [removing, setRemoving] = useState<number | null>(null);
  const items = change.items.map((i) => ({ label: i.label, garmentId: i.garmentId, multiplesGroupId: i.multiplesGroupId }));
  return (
    <Card className="grid gap-2">
      <div className="flex flex-wrap items-center gap-2">
        <h2 className="font-semibold text-ink">
          {change.characterName} · change {change.number}
        </h2>
        <Badge tone={approvalTone[change.approval]}>{change.approval}</Badge>
        {change.storyDayFrom != null && (
          <span className="text-sm text-slate">
            story days {change.storyDayFrom}–{change.storyDayTo ?? "…"}
          </span>
        )}
        {canApprove && (
          <span className="ml-auto flex gap-1">
            {change.approval !== "proposed" && (
              <Button size="sm" variant="secondary" onClick={() => approve.mutate({ id: change.id, approval: "proposed" })}>
                Propose
              </Button>
            )}
            {change.approval !== "approved" && (
              <Button size="sm" onClick={() => approve.mutate({ id: change.id, approval: "approved" })}>
                Approve
              </Button>
            )}
          </span>
        )}
      </div>
      {change.description && <p className="text-sm">{change.description}</p>}
      <div>
        <h3 className="text-sm font-semibold text-ink">Items</h3>
        <ul className="text-sm">
          {change.items.map((i, n) => (
            <li key={i.id} className="flex items-center gap-2">
              {i.label}
              {i.garmentId && <Badge>garment linked</Badge>}
              {i.multiplesGroupId && <Badge tone="note">multiples group</Badge>}
              {canEdit && (
                <button
                  type="button"
                  className="min-h-8 text-xs text-madder underline"
                  onClick={() => setRemoving(n)}
                  aria-label={`Remove ${i.label} from change ${change.number}`}
                >
                  remove
                </button>
              )}
            </li>
          ))}
        </ul>
        <ConfirmDialog
          open={removing !== null}
          title={`Remove ${removing !== null ? (change.items[removing]?.label ?? "") : ""} from change ${change.number}?`}
          confirmLabel="Remove item"
          danger
          busy={update.isPending}
          onCancel={() => setRemoving(null)}
          onConfirm={() =>
            removing !== null &&
            update.mutate(
              { id: change.id, input: { items: items.filter((_, k) => k !== removing) } },
              { onSettled: () => setRemoving(null) },
            )
          }
        >
          {removing !== null && change.items[removing]?.garmentId ? "Its link to the garment goes too (the garment stays in stock). " : ""}
          {change.approval === "approved" ? "Editing an approved change sends it back to draft." : ""}
        </ConfirmDialog>
        {canEdit && (
          <form
            className="mt-1 flex gap-2"
            onSubmit={(e) => {
              e.preventDefault();
              if (label.trim())
                update.mutate(
                  { id: change.id, input: { items: [...items, { label: label.trim(), garmentId: null, multiplesGroupId: null }] } },
                  { onSuccess: () => setLabel("") },
                );
            }}
          >
            <input
              className={`${controlClass} max-w-60 py-1`}
              placeholder="Add item (e.g. waistcoat)"
              aria-label={`New item for change ${change.number}`}
              value={label}
              onChange={(e) => setLabel(e.target.value)}
            />
            <Button size="sm" type="submit" busy={update.isPending}>
              Add
            </Button>
          </form>
        )}
        {update.error && <ErrorAlert error={update.error} title="Not saved" />}
      </div>
      <p className="text-sm">
        <span className="font-semibold text-ink">Scenes: </span>
        {change.scenes.length
          ? change.scenes.map((s, i) => (
              <span key={s.sceneId}>
                {i > 0 && ", "}
                <Link to={`/p/${productionId}/breakdown/scenes/${s.sceneId}`}>{s.number}</Link>
                {s.distressStage > 0 ? ` (d${s.distressStage})` : ""}
              </span>
            ))
          : "not used yet"}
      </p>
    </Card>
  );
}

function NewChangeForm({ productionId, characterId }: { productionId: string; characterId: string }) {
  const create = useCreateChange(productionId);
  const [v, setV] = useState({ description: "", from: "", to: "" });
  const fields = create.error instanceof ApiError ? create.error.fields : {};
  return (
    <Card>
      <form
        className="grid gap-2 sm:grid-cols-4"
        onSubmit={(e) => {
          e.preventDefault();
          create.mutate(
            {
              characterId,
              description: v.description || null,
              storyDayFrom: v.from ? Number(v.from) : null,
              storyDayTo: v.to ? Number(v.to) : null,
            },
            { onSuccess: () => setV({ description: "", from: "", to: "" }) },
          );
        }}
      >
        <InputField
          label="New change: description"
          value={v.description}
          onChange={(e) => setV({ ...v, description: e.target.value })}
          error={fields.description}
        />
        <InputField
          label="From story day"
          type="number"
          min={1}
          value={v.from}
          onChange={(e) => setV({ ...v, from: e.target.value })}
          error={fields.storyDayFrom}
        />
        <InputField
          label="To story day"
          type="number"
          min={1}
          value={v.to}
          onChange={(e) => setV({ ...v, to: e.target.value })}
          error={fields.storyDayTo}
        />
        <div className="flex items-end">
          <Button type="submit" busy={create.isPending}>
            Add change
          </Button>
        </div>
      </form>
    </Card>
  );
}
