import { useState } from "react";
import type { ImportPreviewDto, ImportRowChange } from "@shared/schemas/breakdown";
import { breakdownCsvColumns, breakdownCsvFormats, CLEAR_TOKEN } from "@shared/domain/breakdown-csv";
import { Button } from "@/components/ui/button";
import { Badge, ErrorAlert } from "@/components/ui/feedback";
import { useImportBreakdown, useImportPreview } from "../api/breakdown";

/** Rows shown in the preview table; the counts above it cover the whole file. */
const SHOWN_ROWS = 500;

const linkClass =
  "inline-flex min-h-11 items-center rounded-md border border-ink-100 bg-white px-3.5 py-2 font-semibold text-ink hover:bg-ink-50";

/** "old → new" with empty values named, so a cleared field reads as cleared. */
function OldNew({ old, next }: { old: string; next: string }) {
  return (
    <span>
      <span className={old ? "text-slate line-through decoration-slate/50" : "text-slate italic"}>{old || "empty"}</span>
      <span aria-hidden> → </span>
      <span className="sr-only"> becomes </span>
      <span className={next ? "font-semibold text-ink-900" : "font-semibold text-madder italic"}>{next || "empty"}</span>
    </span>
  );
}

/**
 * CSV import: choose a file, see per row each field's old → new value and every bad row, then
 * import all or nothing. Import merges: an absent column or empty cell keeps what is stored.
 */
export function ImportPanel({ productionId, canImport }: { productionId: string; canImport: boolean }) {
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [preview, setPreview] = useState<ImportPreviewDto | null>(null);
  const [showUnchanged, setShowUnchanged] = useState(false);
  const previewM = useImportPreview(productionId);
  const importM = useImportBreakdown(productionId);
  const exportHref = `/api/productions/${productionId}/scenes/export`;
  const templateHref = `/api/productions/${productionId}/imports/breakdown/template`;
  const rows: ImportRowChange[] = preview
    ? showUnchanged
      ? preview.changes
      : preview.changes.filter((c) => c.status !== "unchanged")
    : [];
  const changedDays = preview ? preview.days.filter((d) => d.status !== "unchanged") : [];
  return (
    <div className="grid gap-3 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        <a className={linkClass} href={exportHref} download>
          Export CSV
        </a>
        {canImport && (
          <a className={linkClass} href={templateHref} download>
            Download a template
          </a>
        )}
      </div>
      <details className="rounded border border-chalk-200 bg-white p-3">
        <summary className="cursor-pointer font-semibold text-ink">Columns and what each accepts</summary>
        <p className="mt-2">
          Importing <strong>merges</strong> into the breakdown: a column the file does not have, or an empty cell, keeps what is stored. To
          empty a field, write <code className="rounded bg-ink-50 px-1">{CLEAR_TOKEN}</code> in its cell. A scene shot on several days
          repeats on a row with only scene and the shoot columns. Lines starting with # are ignored.
        </p>
        <dl className="mt-2 grid gap-1 sm:grid-cols-[10rem_1fr]">
          {breakdownCsvColumns.map((c) => (
            <div key={c} className="contents">
              <dt className="font-mono text-xs font-semibold">{c}</dt>
              <dd className="text-slate">{breakdownCsvFormats[c]}</dd>
            </div>
          ))}
        </dl>
      </details>
      {canImport && (
        <>
          <label className="grid gap-1 font-semibold text-ink-900">
            Import a CSV file
            <input
              type="file"
              accept=".csv,text/csv"
              onChange={async (e) => {
                const f = e.target.files?.[0];
                setPreview(null);
                importM.reset();
                if (!f) return setFile(null);
                const text = await f.text();
                setFile({ name: f.name, text });
                setPreview(await previewM.mutateAsync(text));
              }}
            />
          </label>
          {previewM.isPending && <p role="status">Checking the file…</p>}
          {previewM.error && <ErrorAlert error={previewM.error} />}
          {preview && (
            <div className="grid gap-3 rounded border border-chalk-200 bg-white p-3" aria-label="Import preview" role="region">
              <p>
                {preview.rows} rows. Scenes: {preview.scenes.created} new, {preview.scenes.updated} changed, {preview.scenes.unchanged}{" "}
                unchanged. Shoot days: {preview.shootDays.created} new, {preview.shootDays.updated} changed, {preview.shootDays.unchanged}{" "}
                unchanged. Nothing is written until you press Import.
              </p>
              {preview.errors.length > 0 ? (
                <>
                  <p role="alert" className="font-semibold text-madder">
                    {preview.errors.length} problem{preview.errors.length > 1 ? "s" : ""}: nothing will be imported until the file is fixed.
                  </p>
                  <table className="text-left" aria-label="Import problems">
                    <thead>
                      <tr>
                        <th className="pr-3">Line</th>
                        <th className="pr-3">Column</th>
                        <th>What is wrong</th>
                      </tr>
                    </thead>
                    <tbody>
                      {preview.errors.slice(0, 200).map((e, i) => (
                        <tr key={i}>
                          <td className="pr-3">{e.line}</td>
                          <td className="pr-3">{e.column}</td>
                          <td>{e.message}</td>
                        </tr>
                      ))}
                    </tbody>
                  </table>
                </>
              ) : (
                <>
                  <label className="flex items-center gap-2">
                    <input type="checkbox" checked={showUnchanged} onChange={(e) => setShowUnchanged(e.target.checked)} /> Show unchanged
                    rows too
                  </label>
                  <div className="max-h-[28rem] overflow-auto">
                    <table className="w-full text-left" aria-label="Changes per row">
                      <thead className="sticky top-0 bg-white text-xs uppercase tracking-wide text-slate">
                        <tr>
                          <th className="py-1 pr-3">Line</th>
                          <th className="py-1 pr-3">Scene</th>
                          <th className="py-1 pr-3">Result</th>
                          <th className="py-1">Field: stored → file</th>
                        </tr>
                      </thead>
                      <tbody>
                        {rows.slice(0, SHOWN_ROWS).map((r) => (
                          <tr key={r.line} className="border-t border-chalk-200 align-top">
                            <td className="py-1 pr-3">{r.line}</td>
                            <td className="py-1 pr-3 font-semibold">{r.scene}</td>
                            <td className="py-1 pr-3">
                              <Badge tone={r.status === "new" ? "neutral" : r.status === "changed" ? "warning" : "note"}>{r.status}</Badge>
                            </td>
                            <td className="py-1">
                              {r.fields.length === 0 ? (
                                <span className="text-slate">no change</span>
                              ) : (
                                <ul className="grid gap-0.5">
                                  {r.fields.map((f) => (
                                    <li key={f.column}>
                                      <span className="font-mono text-xs">{f.column}</span>: <OldNew old={f.old} next={f.new} />
                                    </li>
                                  ))}
                                </ul>
                              )}
                            </td>
                          </tr>
                        ))}
                      </tbody>
                    </table>
                    {rows.length === 0 && <p className="py-2 text-slate">No row changes anything.</p>}
                    {rows.length > SHOWN_ROWS && <p className="py-2 text-slate">and {rows.length - SHOWN_ROWS} more rows.</p>}
                  </div>
                  {changedDays.length > 0 && (
                    <div>
                      <h3 className="font-semibold text-ink">Shoot days</h3>
                      <ul className="grid gap-1" aria-label="Shoot day changes">
                        {changedDays.map((d) => (
                          <li key={d.dayNumber}>
                            Day {d.dayNumber} <Badge tone={d.status === "new" ? "neutral" : "warning"}>{d.status}</Badge>
                            {d.date.old !== d.date.new && (
                              <>
                                {" "}
                                date <OldNew old={d.date.old} next={d.date.new} />
                              </>
                            )}
                            {d.scenes.old.join(",") !== d.scenes.new.join(",") && (
                              <>
                                {" "}
                                scenes <OldNew old={d.scenes.old.join(", ")} next={d.scenes.new.join(", ")} />
                              </>
                            )}
                          </li>
                        ))}
                      </ul>
                    </div>
                  )}
                  <div>
                    <Button
                      onClick={() => file && importM.mutate({ csv: file.text, fileName: file.name })}
                      busy={importM.isPending}
                      disabled={
                        importM.isSuccess ||
                        preview.scenes.created + preview.scenes.updated + preview.shootDays.created + preview.shootDays.updated === 0
                      }
                    >
                      Import {preview.rows} row{preview.rows === 1 ? "" : "s"}
                    </Button>
                  </div>
                </>
              )}
              {importM.error && <ErrorAlert error={importM.error} title="Nothing was imported" />}
              {importM.isSuccess && (
                <p role="status" className="font-semibold text-ink">
                  Imported: {importM.data.scenes.created} new and {importM.data.scenes.updated} changed scenes,{" "}
                  {importM.data.shootDays.created} new and {importM.data.shootDays.updated} changed shoot days.
                </p>
              )}
            </div>
          )}
        </>
      )}
    </div>
  );
}
