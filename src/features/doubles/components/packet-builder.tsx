import { useState, type ReactNode } from "react";
import type { PacketDetailDto, PacketSelection } from "@shared/schemas/packets";
import { Button } from "@/components/ui/button";
import { InputField, TextareaField } from "@/components/ui/field";
import { MESH_EDGE_RANGE_MM } from "@shared/domain/panels/mesh";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { ConfirmDialog } from "@/components/ui/dialog";
import { ApiError } from "@/lib/api-client";
import {
  useDeletePacket,
  usePacketOptions,
  usePublishPacket,
  usePublishProgress,
  useUpdatePacket,
  type PublishProgress,
} from "../api/packets";

function toggle(list: string[], id: string, on: boolean): string[] {
  return on ? [...new Set([...list, id])] : list.filter((x) => x !== id);
}

function Group({ title, children, error }: { title: string; children: ReactNode; error?: string }) {
  return (
    <fieldset className="grid gap-1 rounded border border-chalk-200 p-3">
      <legend className="px-1 text-sm font-semibold text-ink-900">{title}</legend>
      {children}
      {error && (
        <p role="alert" className="text-sm text-madder">
          {error}
        </p>
      )}
    </fieldset>
  );
}

/** Plain words for how far publishing is. */
function describeProgress(p: PublishProgress | null): string {
  if (!p) return "Publishing…";
  if (p.stage === "files") return `Building the files: ${p.done} of ${p.total} groups done…`;
  if (p.stage === "zip") return `Writing the ZIP: ${p.done} of ${p.total} files…`;
  return "Taking the snapshot…";
}

/** Choose what goes in a draft; save; publish (supervisor) as the next immutable version. */
export function PacketBuilder({
  productionId,
  packet,
  canPublish,
  onPublished,
}: {
  productionId: string;
  packet: PacketDetailDto;
  canPublish: boolean;
  onPublished: (p: PacketDetailDto) => void;
}) {
  const options = usePacketOptions(productionId, packet.changeId);
  const [s, setS] = useState<PacketSelection>(packet.selection);
  const [confirm, setConfirm] = useState(false);
  const [confirmDelete, setConfirmDelete] = useState(false);
  const update = useUpdatePacket(productionId);
  const publish = usePublishPacket(productionId, onPublished);
  const progress = usePublishProgress(productionId, packet.id, publish.isPending);
  const del = useDeletePacket(productionId);
  const fields = {
    ...(update.error instanceof ApiError ? update.error.fields : {}),
    ...(publish.error instanceof ApiError ? publish.error.fields : {}),
  };
  if (options.isPending) return <Spinner />;
  if (options.error) return <ErrorAlert error={options.error} />;
  const o = options.data;
  const check = (label: string, checked: boolean, onChange: (v: boolean) => void, key: string) => (
    <label key={key} className="flex items-center gap-2 text-sm">
      <input type="checkbox" checked={checked} onChange={(e) => onChange(e.target.checked)} /> {label}
    </label>
  );
  const dirty = JSON.stringify(s) !== JSON.stringify(packet.selection);
  return (
    <div className="grid gap-3" aria-label="Packet builder">
      <div className="grid gap-3 lg:grid-cols-2">
        <Group title="Garments and panels" error={fields.garmentIds ?? fields.panelIds}>
          {o.garments.map((g) => (
            <div key={g.id}>
              {check(
                `${g.name} (${g.panels.length} panels)`,
                s.garmentIds.includes(g.id),
                (v) =>
                  setS({
                    ...s,
                    garmentIds: toggle(s.garmentIds, g.id, v),
                    panelIds: v ? s.panelIds : s.panelIds.filter((id) => !g.panels.some((p) => p.id === id)),
                  }),
                g.id,
              )}
              {s.garmentIds.includes(g.id) && s.panelIds.length > 0 && (
                <div className="ml-6 grid">
                  {g.panels.map((p) =>
                    check(
                      `${p.name} ×${p.cutCount}`,
                      s.panelIds.includes(p.id),
                      (v) => setS({ ...s, panelIds: toggle(s.panelIds, p.id, v) }),
                      p.id,
                    ),
                  )}
                </div>
              )}
            </div>
          ))}
          {check(
            "Choose single panels (otherwise every panel of the chosen garments)",
            s.panelIds.length > 0,
            (v) =>
              setS({
                ...s,
                panelIds: v ? o.garments.filter((g) => s.garmentIds.includes(g.id)).flatMap((g) => g.panels.map((p) => p.id)) : [],
              }),
            "pick-panels",
          )}
        </Group>
        <Group title="Effects shots" error={fields.appearanceIds}>
          {o.shots.length === 0 && <p className="text-sm text-slate">No appearances of this change are marked as effects shots.</p>}
          {o.shots.map((x) =>
            check(
              `Scene ${x.sceneNumber}: distress ${x.distressStage}${x.wet ? ", wet" : ""}${x.blood ? ", blood" : ""}`,
              s.appearanceIds.includes(x.appearanceId),
              (v) => setS({ ...s, appearanceIds: toggle(s.appearanceIds, x.appearanceId, v) }),
              x.appearanceId,
            ),
          )}
        </Group>
        <Group title="Reference photos" error={fields.photoIds}>
          {o.photos.length === 0 && <p className="text-sm text-slate">No fitting, garment or continuity photos yet.</p>}
          {o.photos.map((p) =>
            check(
              `${p.label}${p.caption ? `: ${p.caption}` : ""}`,
              s.photoIds.includes(p.id),
              (v) => setS({ ...s, photoIds: toggle(s.photoIds, p.id, v) }),
              p.id,
            ),
          )}
        </Group>
        <Group title="Send to (vfx members)" error={fields.recipientUserIds}>
          {o.vfxMembers.length === 0 && (
            <p className="text-sm text-slate">Invite the effects artists with the vfx role on the Team screen.</p>
          )}
          {o.vfxMembers.map((m) =>
            check(
              `${m.name} (${m.email})`,
              s.recipientUserIds.includes(m.userId),
              (v) => setS({ ...s, recipientUserIds: toggle(s.recipientUserIds, m.userId, v) }),
              m.userId,
            ),
          )}
        </Group>
      </div>
      <Group title="Performer measurements">
        {check(
          o.hasMeasurements ? "Include the performer's measurements" : "No measurements recorded",
          s.includeMeasurements,
          (v) => setS({ ...s, includeMeasurements: v }),
          "measurements",
        )}
        <p className="text-xs text-slate">
          Personal data: off by default. Include them only when the double cannot be built without them; recipients are told to keep them
          confidential.
        </p>
      </Group>
      <InputField
        label="Simulation mesh: target edge length (mm)"
        type="number"
        min={MESH_EDGE_RANGE_MM.min}
        max={MESH_EDGE_RANGE_MM.max}
        step={1}
        value={Number.isFinite(s.meshEdgeMm) ? s.meshEdgeMm : ""}
        onChange={(e) => setS({ ...s, meshEdgeMm: e.target.value === "" ? Number.NaN : Number(e.target.value) })}
        error={fields.meshEdgeMm}
        hint={`Each panel goes in as a triangle mesh a cloth solver can load, with stitches.json pairing the vertices along every seam. ${MESH_EDGE_RANGE_MM.min}–${MESH_EDGE_RANGE_MM.max} mm; 10 mm suits most garments, smaller makes more triangles.`}
      />
      <TextareaField label="Notes for the artists" value={s.notes ?? ""} onChange={(e) => setS({ ...s, notes: e.target.value || null })} />
      {update.error && !Object.keys(fields).length && <ErrorAlert error={update.error} title="Not saved" />}
      {publish.error && <ErrorAlert error={publish.error} title="Not published" />}
      <div className="flex flex-wrap gap-2">
        <Button variant="secondary" disabled={!dirty} busy={update.isPending} onClick={() => update.mutate({ id: packet.id, input: s })}>
          Save draft
        </Button>
        {canPublish && (
          <Button disabled={dirty} onClick={() => setConfirm(true)}>
            Publish version
          </Button>
        )}
        <Button variant="ghost" busy={del.isPending} onClick={() => setConfirmDelete(true)}>
          Delete draft
        </Button>
        {dirty && <span className="self-center text-xs text-slate">Save the draft before publishing.</span>}
      </div>
      {del.error && <ErrorAlert error={del.error} title="Draft not deleted" />}
      <ConfirmDialog
        open={confirmDelete}
        title="Delete this draft?"
        confirmLabel="Delete draft"
        danger
        busy={del.isPending}
        onCancel={() => setConfirmDelete(false)}
        onConfirm={() => del.mutate(packet.id, { onSettled: () => setConfirmDelete(false) })}
      >
        The choices in this draft are lost. Published versions stay as they are.
      </ConfirmDialog>
      <ConfirmDialog
        open={confirm}
        title="Publish this packet?"
        confirmLabel="Publish"
        busy={publish.isPending}
        onCancel={() => setConfirm(false)}
        onConfirm={() => publish.mutate(packet.id, { onSettled: () => setConfirm(false) })}
      >
        It becomes a numbered version that never changes, and the chosen vfx members are e-mailed. Later edits make a new version.
        {publish.isPending && (
          <span className="mt-2 block text-sm text-ink" role="status">
            {describeProgress(progress.data ?? null)}
          </span>
        )}
      </ConfirmDialog>
    </div>
  );
}
