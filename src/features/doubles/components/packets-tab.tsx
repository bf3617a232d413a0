import { Link, useNavigate } from "react-router-dom";
import type { DoublesChangeDto } from "@shared/schemas/doubles";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Badge, EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { useCreatePacket, usePackets } from "../api/packets";
import { useProductionTime } from "@/hooks/use-production-time";

/** Versions and drafts of the change's handoff packet, and "new draft". */
export function PacketsTab({ productionId, change, canPrepare }: { productionId: string; change: DoublesChangeDto; canPrepare: boolean }) {
  const list = usePackets(productionId, change.id);
  const create = useCreatePacket(productionId);
  const navigate = useNavigate();
  const { dateOf } = useProductionTime();
  const hasDraft = list.data?.some((p) => p.status === "draft");
  return (
    <Card>
      <div className="mb-3 flex flex-wrap items-center justify-between gap-2">
        <h2 className="font-semibold text-ink">
          Handoff packets for {change.characterName}, change {change.number}
        </h2>
        {canPrepare && !hasDraft && (
          <Button
            busy={create.isPending}
            onClick={() => create.mutate({ changeId: change.id }, { onSuccess: (p) => void navigate(`packets/${p.id}`) })}
          >
            New draft
          </Button>
        )}
      </div>
      {create.error && <ErrorAlert error={create.error} title="No draft started" />}
      {list.isPending ? (
        <Spinner />
      ) : list.error ? (
        <ErrorAlert error={list.error} />
      ) : list.data.length === 0 ? (
        <EmptyState title="No packets yet">
          Start a draft: choose panels, photos and effects shots, then the supervisor publishes it to the vfx artists.
        </EmptyState>
      ) : (
        <table className="w-full text-left text-sm" aria-label="Packets">
          <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
            <tr>
              <th className="px-2 py-1">Version</th>
              <th className="px-2 py-1">Published</th>
              <th className="px-2 py-1">Contents</th>
              <th className="px-2 py-1">Received</th>
            </tr>
          </thead>
          <tbody>
            {list.data.map((p) => (
              <tr key={p.id} className="border-b border-chalk-200 last:border-0">
                <td className="px-2 py-1">
                  <Link className="font-semibold text-ink underline" to={`packets/${p.id}`}>
                    {p.status === "draft" ? "Draft" : `Version ${p.version}`}
                  </Link>
                </td>
                <td className="px-2 py-1">
                  {p.publishedAt ? `${dateOf(p.publishedAt)} by ${p.publishedByName ?? ""}` : <Badge tone="warning">not published</Badge>}
                </td>
                <td className="px-2 py-1">
                  {p.counts.panels} panels · {p.counts.photos} photos · {p.counts.shots} shots
                  {p.includeMeasurements ? " · measurements" : ""}
                </td>
                <td className="px-2 py-1">
                  {p.status === "published" ? `${p.recipients.filter((r) => r.receivedAt).length} of ${p.recipients.length}` : "—"}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </Card>
  );
}
