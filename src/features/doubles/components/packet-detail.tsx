import type { PacketDetailDto } from "@shared/schemas/packets";
import type { DiffGroup } from "@shared/domain/packet-diff";
import { Badge } from "@/components/ui/feedback";
import { packetDownloadHref } from "../api/packets";
import { useProductionTime } from "@/hooks/use-production-time";
import { formatNumber } from "@shared/format";

function DiffList({ label, g }: { label: string; g: DiffGroup }) {
  if (!g.added.length && !g.removed.length && !g.changed.length) return null;
  return (
    <div>
      <h4 className="text-sm font-semibold text-ink">{label}</h4>
      <ul className="text-sm">
        {g.added.map((e) => (
          <li key={`a${e.id}`}>
            <Badge tone="note">added</Badge> {e.name}
          </li>
        ))}
        {g.removed.map((e) => (
          <li key={`r${e.id}`}>
            <Badge tone="blocking">removed</Badge> {e.name}
          </li>
        ))}
        {g.changed.map((e) => (
          <li key={`c${e.id}`}>
            <Badge tone="warning">changed</Badge> {e.name} <span className="text-xs text-slate">({e.fields?.join(", ")})</span>
          </li>
        ))}
      </ul>
    </div>
  );
}

/** The groups of one diff, or a note when nothing differs. */
export function PacketDiffList({ diff: d }: { diff: NonNullable<PacketDetailDto["diff"]> }) {
  return (
    <div className="grid gap-2">
      {d.empty ? <p className="text-sm text-slate">No differences.</p> : null}
      <DiffList label="Panels" g={d.panels} />
      <DiffList label="Seams" g={d.seams} />
      <DiffList label="Fabrics" g={d.fabrics} />
      <DiffList label="Effects shots" g={d.shots} />
      <DiffList label="Photos" g={d.photos} />
      {d.measurements !== "unchanged" && <p className="text-sm">Performer measurements: {d.measurements}</p>}
    </div>
  );
}

/** What changed since the previous version. */
export function PacketDiffView({ packet }: { packet: PacketDetailDto }) {
  if (!packet.diff)
    return <p className="text-sm text-slate">{packet.previousVersion === null ? "First version: nothing to compare with." : ""}</p>;
  const d = packet.diff;
  return (
    <section aria-label="Changes since the previous version" className="grid gap-2">
      <h3 className="font-semibold text-ink">Since version {packet.previousVersion}</h3>
      <PacketDiffList diff={d} />
    </section>
  );
}

/** Contents summary, checksum, download link and the recipients' receipts. */
export function PacketDetail({
  productionId,
  packet,
  showRecipients,
}: {
  productionId: string;
  packet: PacketDetailDto;
  showRecipients: boolean;
}) {
  const c = packet.contents;
  const { dateTime } = useProductionTime();
  const when = (iso: string | null) => (iso ? dateTime(iso) : "—");
  return (
    <div className="grid grid-cols-1 gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <a
          className="inline-flex min-h-12 items-center rounded-md bg-ink px-5 py-3 font-semibold text-chalk hover:bg-ink-700"
          href={packetDownloadHref(productionId, packet.id)}
          download
        >
          {packet.status === "published"
            ? `Download version ${packet.version} (ZIP${packet.zipBytes ? `, ${formatNumber(packet.zipBytes / 1e6, 2)} MB` : ""})`
            : "Download a draft preview (ZIP)"}
        </a>
        {packet.zipSha256 && (
          <code className="break-all text-xs text-slate" title="SHA-256 of the ZIP">
            SHA-256 {packet.zipSha256}
          </code>
        )}
      </div>
      <dl className="grid grid-cols-2 gap-2 text-sm sm:grid-cols-5">
        <div>
          <dt className="text-xs text-slate">Garments</dt>
          <dd>{c.garments.map((g) => g.name).join(", ") || "—"}</dd>
        </div>
        <div>
          <dt className="text-xs text-slate">Panels</dt>
          <dd>{c.panels.length}</dd>
        </div>
        <div>
          <dt className="text-xs text-slate">Seams</dt>
          <dd>
            {c.seams.length}
            {c.seams.some((s) => s.status === "mismatch" || s.status === "eased_out_of_range") ? (
              <Badge tone="blocking">mismatch</Badge>
            ) : null}
          </dd>
        </div>
        <div>
          <dt className="text-xs text-slate">Photos</dt>
          <dd>{c.photos.length}</dd>
        </div>
        <div>
          <dt className="text-xs text-slate">Measurements</dt>
          <dd>{c.measurements ? "included (personal data)" : "not included"}</dd>
        </div>
      </dl>
      {c.shots.length > 0 && (
        <div>
          <h3 className="font-semibold text-ink">Effects shots</h3>
          <ul className="text-sm">
            {c.shots.map((s) => (
              <li key={s.appearanceId}>
                Scene {s.sceneNumber}: distress stage {s.distressStage}
                {s.wet ? ", wet" : ""}
                {s.blood ? ", blood" : ""}
                {s.stunt ? ", stunt" : ""}
                {s.photoFiles.length ? ` · ${s.photoFiles.length} photo(s)` : ""}
              </li>
            ))}
          </ul>
        </div>
      )}
      {c.notes && (
        <p className="text-sm">
          <span className="font-semibold">Notes:</span> {c.notes}
        </p>
      )}
      <PacketDiffView packet={packet} />
      {showRecipients && packet.status === "published" && (
        <div>
          <h3 className="font-semibold text-ink">Recipients</h3>
          <table className="w-full text-left text-sm" aria-label="Recipients">
            <thead className="text-xs uppercase tracking-wide text-slate">
              <tr>
                <th className="px-2">Who</th>
                <th className="px-2">E-mailed</th>
                <th className="px-2">Downloaded</th>
                <th className="px-2">Received</th>
              </tr>
            </thead>
            <tbody>
              {packet.recipients.map((r) => (
                <tr key={r.userId}>
                  <td className="px-2">
                    {r.name} <span className="text-xs text-slate">{r.email}</span>
                  </td>
                  <td className="px-2">{when(r.notifiedAt)}</td>
                  <td className="px-2">{when(r.downloadedAt)}</td>
                  <td className="px-2">
                    {r.receivedAt ? <Badge tone="note">received {when(r.receivedAt)}</Badge> : <Badge tone="warning">not yet</Badge>}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
