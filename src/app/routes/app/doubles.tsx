import { useState } from "react";
import { Link, Route, Routes, useParams, useSearchParams } from "react-router-dom";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/field";
import { EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { useDoublesChanges } from "@/features/doubles/api/doubles";
import { useMarkReceived, usePacket } from "@/features/doubles/api/packets";
import { PanelsTab } from "@/features/doubles/components/panels-tab";
import { SeamsTab } from "@/features/doubles/components/seams-tab";
import { YardageTab } from "@/features/doubles/components/yardage-tab";
import { PhysicsTab } from "@/features/doubles/components/physics-tab";
import { PacketsTab } from "@/features/doubles/components/packets-tab";
import { PacketBuilder } from "@/features/doubles/components/packet-builder";
import { PacketDetail } from "@/features/doubles/components/packet-detail";
import { VfxPackets } from "@/features/doubles/components/vfx-packets";
import { ArtistPacketView } from "@/features/doubles/components/artist-packet";
import { useProductionTime } from "@/hooks/use-production-time";
import { onTabListKeyDown } from "@/components/ui/tabs";

const tabs = [
  { key: "panels", label: "Panels" },
  { key: "seams", label: "Seams" },
  { key: "yardage", label: "Yardage" },
  { key: "physics", label: "Fabric physics" },
  { key: "packets", label: "Handoff packets" },
] as const;

/** Staff view: choose a character's change, then panels, seams, yardage, physics and packets. */
function DoublesWorkspace() {
  const { productionId, can } = useCurrentProduction();
  const changes = useDoublesChanges(productionId);
  const [params, setParams] = useSearchParams();
  const tab = (params.get("tab") ?? "panels") as (typeof tabs)[number]["key"];
  if (changes.isPending) return <Spinner />;
  if (changes.error) return <ErrorAlert error={changes.error} />;
  if (!changes.data.length)
    return (
      <EmptyState title="No costume changes yet">
        Changes are set up on the Changes screen; each character's change gets its panels here.
      </EmptyState>
    );
  const withPanels = changes.data.find((c) => c.garments.some((g) => g.panelCount > 0));
  const changeId = params.get("change") ?? withPanels?.id ?? changes.data[0]!.id;
  const change = changes.data.find((c) => c.id === changeId) ?? changes.data[0]!;
  const set = (k: string, v: string) =>
    setParams((p) => {
      p.set(k, v);
      return p;
    });
  return (
    <div className="grid grid-cols-1 gap-4">
      <Card className="grid grid-cols-1 gap-3 sm:grid-cols-[minmax(0,24rem)_1fr] sm:items-end">
        <SelectField label="Character and change" value={change.id} onChange={(e) => set("change", e.target.value)}>
          {changes.data.map((c) => (
            <option key={c.id} value={c.id}>
              {c.characterName}: change {c.number}
              {c.description ? ` (${c.description.slice(0, 40)})` : ""}
            </option>
          ))}
        </SelectField>
        <div role="tablist" aria-label="Doubles sections" tabIndex={-1} onKeyDown={onTabListKeyDown} className="flex flex-wrap gap-2">
          {tabs.map((t) => (
            <Button
              key={t.key}
              role="tab"
              aria-selected={tab === t.key}
              variant={tab === t.key ? "primary" : "secondary"}
              onClick={() => set("tab", t.key)}
            >
              {t.label}
            </Button>
          ))}
        </div>
      </Card>
      {tab === "panels" && <PanelsTab key={change.id} productionId={productionId} change={change} canEdit={can("panel.update")} />}
      {tab === "seams" && <SeamsTab key={change.id} productionId={productionId} change={change} canEdit={can("panel.update")} />}
      {tab === "yardage" && <YardageTab key={change.id} productionId={productionId} change={change} canEdit={can("panel.update")} />}
      {tab === "physics" && <PhysicsTab key={change.id} productionId={productionId} change={change} />}
      {tab === "packets" &&
        (can("packet.prepare") ? (
          <PacketsTab productionId={productionId} change={change} canPrepare />
        ) : (
          <p className="text-sm text-slate">Handoff packets are prepared by the workroom and published by the supervisor.</p>
        ))}
    </div>
  );
}

/** One packet: builder for a draft, contents, diff and receipts for a version. */
function PacketPage() {
  const { packetId = "" } = useParams();
  const { productionId, can } = useCurrentProduction();
  const { dateTime } = useProductionTime();
  const q = usePacket(productionId, packetId);
  const received = useMarkReceived(productionId);
  const [justPublished, setJustPublished] = useState(false);
  if (q.isPending) return <Spinner />;
  if (q.error) return <ErrorAlert error={q.error} title="Packet not available" />;
  const p = q.data;
  // A vfx user's packet lists only their own receipt.
  const mine = can("packet.receive") ? p.recipients[0] : undefined;
  return (
    <div className="grid gap-4">
      <PageHeader
        title={`${p.characterName}, change ${p.changeNumber}: ${p.status === "draft" ? "draft packet" : `version ${p.version}`}`}
        subtitle={p.publishedAt ? `Published ${dateTime(p.publishedAt)} by ${p.publishedByName ?? ""}` : "Not published yet"}
        actions={
          <Link
            className="text-sm text-ink underline"
            to={can("packet.read_all") ? `/p/${productionId}/doubles?change=${p.changeId}&tab=packets` : `/p/${productionId}/doubles`}
          >
            Back
          </Link>
        }
      />
      {justPublished && (
        <p role="status" className="rounded bg-ink-50 px-3 py-2 text-sm text-ink">
          Published as version {p.version}; the recipients were e-mailed.
        </p>
      )}
      {p.status === "draft" && can("packet.prepare") && (
        <Card>
          <PacketBuilder
            productionId={productionId}
            packet={p}
            canPublish={can("packet.publish")}
            onPublished={() => setJustPublished(true)}
          />
        </Card>
      )}
      <Card>
        <PacketDetail productionId={productionId} packet={p} showRecipients={can("packet.read_all")} />
        {can("packet.receive") && p.status === "published" && (
          <div className="mt-4">
            {mine?.receivedAt ? (
              <p className="text-sm text-ink">You marked this version received on {dateTime(mine.receivedAt)}.</p>
            ) : (
              <Button size="lg" busy={received.isPending} onClick={() => received.mutate(p.id)}>
                Mark received
              </Button>
            )}
            {received.error && <ErrorAlert error={received.error} />}
          </div>
        )}
      </Card>
      {can("packet.receive") && (
        <Card>
          <ArtistPacketView packet={p} />
        </Card>
      )}
    </div>
  );
}

/** The Digital doubles screen. vfx users see only the packets published to them. */
export default function DoublesPage() {
  const { can, production } = useCurrentProduction();
  // Artists who are sent packets see only those; everyone else works on panels and prepares packets.
  const vfx = can("packet.receive");
  return (
    <Routes>
      <Route path="packets/:packetId" element={<PacketPage />} />
      <Route
        path="*"
        element={
          // grid-cols-1 (minmax(0, 1fr)): panels, tables and canvases scroll inside their cards on a phone.
          <div className="grid grid-cols-1 gap-4">
            <PageHeader
              title="Digital doubles"
              subtitle={
                vfx
                  ? "Handoff packets published to you"
                  : `Pattern panels, seams, yardage, fabric physics and handoff packets${production ? ` for ${production.title}` : ""}`
              }
            />
            {vfx ? <VfxPacketsRoute /> : <DoublesWorkspace />}
          </div>
        }
      />
    </Routes>
  );
}

function VfxPacketsRoute() {
  const { productionId } = useCurrentProduction();
  return <VfxPackets productionId={productionId} />;
}
