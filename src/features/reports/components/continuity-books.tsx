import { useState } from "react";
import type { BookPhotoSize, ContinuityBooksIndexDto, ReportRunDto } from "@shared/schemas/reports";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { EmptyState, ErrorAlert } from "@/components/ui/feedback";
import { SelectField } from "@/components/ui/field";
import { reportFileUrls, useReportRun, useStartBooksRun } from "../api/reports";
import { formatBytes } from "../format";

const linkClass =
  "inline-flex min-h-10 items-center rounded-md border border-ink-100 bg-white px-3 text-sm font-semibold text-ink hover:bg-ink-50";

/** Progress of the "every book" export, then its download link. */
function RunProgress({ productionId, run }: { productionId: string; run: ReportRunDto }) {
  const q = useReportRun(productionId, run.id);
  const r = q.data ?? run;
  const pct = r.total ? Math.round((r.done / r.total) * 100) : 0;
  if (r.status === "failed") return <ErrorAlert error={new Error(r.error ?? "The export failed.")} title="Books not built" />;
  if (r.status === "done")
    return (
      <p className="text-sm">
        <a className="font-semibold text-ink underline" href={r.fileUrl!} download>
          Download every book (ZIP{r.bytes ? `, ${formatBytes(r.bytes)}` : ""})
        </a>{" "}
        <span className="text-slate">
          · {r.total} books, built {new Date(r.finishedAt ?? r.createdAt).toLocaleString("en-GB")}
        </span>
      </p>
    );
  return (
    <div className="grid gap-1" aria-live="polite">
      <progress className="h-3 w-full accent-ink" max={r.total || 1} value={r.done} aria-label="Books written" />
      <p className="text-sm text-slate">
        {r.status === "queued" ? "Waiting to start…" : `Writing book ${Math.min(r.done + 1, r.total)} of ${r.total} (${pct}%)…`}
      </p>
    </div>
  );
}

/** Every character's continuity book (or one change's), and all of them in one ZIP. */
export function ContinuityBooks({ productionId, data }: { productionId: string; data: ContinuityBooksIndexDto }) {
  const [photos, setPhotos] = useState<BookPhotoSize>("thumb");
  const start = useStartBooksRun(productionId);
  const run = start.data ?? data.latestRun;
  const withScenes = data.characters.filter((c) => c.scenes > 0);
  return (
    <div className="grid gap-4">
      <Card className="grid gap-3">
        <p className="text-sm text-slate">
          One book per character: every scene in story order with its shoot day, change, garment copies, distress stage, flags, notes and
          photos by view; a contents page first. Printed on {data.paperSize === "A4" ? "A4" : "US Letter"} (Team → settings). Measurements
          never appear in a book.
        </p>
        <div className="flex flex-wrap items-end gap-3">
          <SelectField
            label="Photos"
            value={photos}
            onChange={(e) => setPhotos(e.target.value as BookPhotoSize)}
            hint="Thumbnails keep the file small; display size prints sharper"
            className="min-w-56"
          >
            <option value="thumb">Thumbnails (smallest file)</option>
            <option value="display">Display size (sharper)</option>
          </SelectField>
          <Button onClick={() => start.mutate(photos)} busy={start.isPending} disabled={!withScenes.length}>
            Build every book (ZIP)
          </Button>
        </div>
        {start.error && <ErrorAlert error={start.error} title="Could not start" />}
        {run && <RunProgress key={run.id} productionId={productionId} run={run} />}
      </Card>
      {data.characters.length === 0 ? (
        <EmptyState title="No characters yet">Add characters and their scenes on the Cast and Breakdown screens.</EmptyState>
      ) : (
        <Card className="p-0">
          <ul className="divide-y divide-chalk-200" aria-label="Continuity books">
            {data.characters.map((c) => (
              <li key={c.id} className="grid gap-2 p-3 sm:grid-cols-[1fr_auto] sm:items-center">
                <div>
                  <p className="font-semibold text-ink-900">{c.name}</p>
                  <p className="text-sm text-slate">
                    {c.scenes} scene{c.scenes === 1 ? "" : "s"} · {c.photos} photo{c.photos === 1 ? "" : "s"} · {c.changes.length} change
                    {c.changes.length === 1 ? "" : "s"}
                  </p>
                </div>
                {c.scenes > 0 ? (
                  <div className="flex flex-wrap gap-2">
                    <a
                      className={linkClass}
                      href={reportFileUrls.continuityBook(productionId, c.id, { photos })}
                      target="_blank"
                      rel="noreferrer"
                    >
                      Book (PDF)
                    </a>
                    {c.changes
                      .filter((ch) => ch.scenes > 0)
                      .map((ch) => (
                        <a
                          key={ch.id}
                          className={linkClass}
                          href={reportFileUrls.continuityBook(productionId, c.id, { changeId: ch.id, photos })}
                          target="_blank"
                          rel="noreferrer"
                          title={ch.description ?? undefined}
                        >
                          Change {ch.number}
                        </a>
                      ))}
                  </div>
                ) : (
                  <span className="text-sm text-slate">Plays in no scene yet</span>
                )}
              </li>
            ))}
          </ul>
        </Card>
      )}
    </div>
  );
}
