import { Link } from "react-router-dom";
import { Card } from "@/components/ui/card";
import { Badge, EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { packetDownloadHref, usePackets } from "../api/packets";
import { useProductionTime } from "@/hooks/use-production-time";

/** A vfx artist's view: only the packet versions published to them. */
export function VfxPackets({ productionId }: { productionId: string }) {
  const q = usePackets(productionId);
  const { dateOf } = useProductionTime();
  if (q.isPending) return <Spinner />;
  if (q.error) return <ErrorAlert error={q.error} />;
  if (!q.data.length)
    return (
      <EmptyState title="No packets for you yet">
        When the costume supervisor publishes a packet to you, it appears here and you get an e-mail.
      </EmptyState>
    );
  return (
    <div className="grid gap-3">
      {q.data.map((p) => {
        const mine = p.recipients[0];
        return (
          <Card key={p.id} className="grid gap-2 sm:grid-cols-[1fr_auto] sm:items-center">
            <div>
              <Link to={`packets/${p.id}`} className="text-lg font-semibold text-ink underline">
                {p.characterName}, change {p.changeNumber}: version {p.version}
              </Link>
              <p className="text-sm text-slate">
                Published {p.publishedAt ? dateOf(p.publishedAt) : ""} · {p.counts.panels} panels, {p.counts.photos} photos,{" "}
                {p.counts.shots} shots
              </p>
              {mine?.receivedAt ? <Badge tone="note">received</Badge> : <Badge tone="warning">not marked received</Badge>}
            </div>
            <a
              className="inline-flex min-h-12 items-center justify-center rounded-md bg-ink px-5 py-3 font-semibold text-chalk"
              href={packetDownloadHref(productionId, p.id)}
              download
            >
              Download ZIP
            </a>
          </Card>
        );
      })}
    </div>
  );
}
