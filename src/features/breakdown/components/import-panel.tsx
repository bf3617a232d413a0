import { useState } from "react";
import type { ImportPreviewDto } from "@shared/schemas/breakdown";
import { breakdownCsvColumns } from "@shared/domain/breakdown-csv";
import { Button } from "@/components/ui/button";
import { ErrorAlert } from "@/components/ui/feedback";
import { useImportBreakdown, useImportPreview } from "../api/breakdown";

/** CSV import: choose a file, see what would change and every bad row, then import all or nothing. */
export function ImportPanel({ productionId, canImport }: { productionId: string; canImport: boolean }) {
  const [file, setFile] = useState<{ name: string; text: string } | null>(null);
  const [preview, setPreview] = useState<ImportPreviewDto | null>(null);
  const previewM = useImportPreview(productionId);
  const importM = useImportBreakdown(productionId);
  const exportHref = `/api/productions/${productionId}/scenes/export`;
  return (
    <div className="grid gap-3 text-sm">
      <div className="flex flex-wrap items-center gap-2">
        <a className="inline-flex items-center rounded-md border border-ink-100 bg-white px-3.5 py-2 font-semibold text-ink hover:bg-ink-50" href={exportHref} download>
          Export CSV
        </a>
        <span className="text-xs text-slate">Columns: {breakdownCsvColumns.join(", ")}. A scene shot on several days repeats on a row with only scene and the shoot columns.</span>
      </div>
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
          {previewM.error && <ErrorAlert error={previewM.error} />}
          {preview && (
            <div className="grid gap-2 rounded border border-chalk-200 bg-white p-3">
              <p>
                {preview.rows} rows: {preview.scenes.created} new scenes, {preview.scenes.updated} updated; {preview.shootDays.created} new shoot days, {preview.shootDays.updated} updated.
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
                <Button onClick={() => file && importM.mutate({ csv: file.text, fileName: file.name })} busy={importM.isPending} disabled={importM.isSuccess}>
                  Import {preview.rows} rows
                </Button>
              )}
              {importM.error && <ErrorAlert error={importM.error} title="Nothing was imported" />}
              {importM.isSuccess && <p role="status" className="font-semibold text-ink">Imported. The breakdown is up to date.</p>}
            </div>
          )}
        </>
      )}
    </div>
  );
}
