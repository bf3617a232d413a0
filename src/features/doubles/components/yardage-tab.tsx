import { useEffect, useRef, useState } from "react";
import type { DoublesChangeDto, MarkerFabricResultDto } from "@shared/schemas/doubles";
import { markerToSvg, type NestResult } from "@shared/domain/panels/nesting";
import type { YardageFabricResult, YardageGroup } from "@shared/domain/panels/yardage";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { InputField, SelectField } from "@/components/ui/field";
import { Badge, ErrorAlert } from "@/components/ui/feedback";
import { useFabricOptions, useMarker, usePanels, useSaveMarker } from "../api/doubles";
import { useProductionTime } from "@/hooks/use-production-time";

const cm = (mm: number) => `${(mm / 10).toFixed(1)} cm`;

/** One fabric's marker: the drawing and the figures. */
function MarkerResult({ r }: { r: MarkerFabricResultDto | YardageFabricResult }) {
  const svg = markerToSvg(r as NestResult);
  return (
    <div className="grid gap-2" aria-label={`Marker for ${r.fabricName}`}>
      <h2 className="font-semibold text-ink">{r.fabricName}</h2>
      <dl className="grid grid-cols-2 gap-x-4 text-sm sm:grid-cols-5">
        <div>
          <dt className="text-xs text-slate">Marker length</dt>
          <dd className="font-semibold">
            {cm(r.markerLengthMm)} ({(r.markerLengthMm / 914.4).toFixed(2)} yd)
          </dd>
        </div>
        <div>
          <dt className="text-xs text-slate">Efficiency</dt>
          <dd className="font-semibold">{(r.efficiency * 100).toFixed(1)} %</dd>
        </div>
        <div>
          <dt className="text-xs text-slate">Lower bound</dt>
          <dd>{cm(r.lowerBoundMm)}</dd>
        </div>
        <div>
          <dt className="text-xs text-slate">Usable width</dt>
          <dd>{cm(r.usableWidthMm)}</dd>
        </div>
        <div>
          <dt className="text-xs text-slate">Copies</dt>
          <dd>
            {r.copies}
            {r.unplaced.length ? <Badge tone="blocking">{r.unplaced.length} too wide</Badge> : null}
          </dd>
        </div>
      </dl>
      <img
        className="max-h-[32rem] w-full rounded border border-chalk-200 bg-white object-contain"
        alt={`Marker drawing for ${r.fabricName}`}
        src={`data:image/svg+xml;charset=utf-8,${encodeURIComponent(svg)}`}
      />
    </div>
  );
}

/** Yardage: lays the pieces of a garment or the whole change (in multiples) in the browser with progress; saves the marker on the server. */
export function YardageTab({ productionId, change, canEdit }: { productionId: string; change: DoublesChangeDto; canEdit: boolean }) {
  const [scopeId, setScopeId] = useState(change.id);
  const [multiples, setMultiples] = useState(1);
  const scope = scopeId === change.id ? ("change" as const) : ("garment" as const);
  const panels = usePanels(productionId, scope === "change" ? { changeId: change.id } : { garmentId: scopeId });
  const fabrics = useFabricOptions(productionId);
  const saved = useMarker(productionId, { scope, scopeId, multiples });
  const save = useSaveMarker(productionId);
  const { dateTime } = useProductionTime();
  const [progress, setProgress] = useState<{ done: number; total: number } | null>(null);
  const [search, setSearch] = useState<{ fraction: number; fabricName: string; bestLengthMm: number } | null>(null);
  const [result, setResult] = useState<YardageFabricResult[] | null>(null);
  const [error, setError] = useState<string | null>(null);
  const worker = useRef<Worker | null>(null);
  useEffect(() => () => worker.current?.terminate(), []);
  // Another scope or multiples choice: the last marker no longer applies (adjusted while rendering).
  const resultFor = `${scopeId}|${String(multiples)}`;
  const [shownFor, setShownFor] = useState(resultFor);
  if (shownFor !== resultFor) {
    setShownFor(resultFor);
    setResult(null);
  }

  const run = () => {
    if (!panels.data) return;
    const garmentFabric = new Map(change.garments.map((g) => [g.id, g.fabricId]));
    const groups = new Map<string, YardageGroup>();
    for (const p of panels.data) {
      const fid = p.fabricId ?? garmentFabric.get(p.garmentId) ?? null;
      const f = fabrics.data?.find((x) => x.id === fid);
      const g = groups.get(fid ?? "none") ?? {
        fabricId: fid,
        fabricName: f?.name ?? "No fabric set",
        clothWidthMm: f?.widthMm ?? null,
        panels: [],
      };
      g.panels.push(p);
      groups.set(fid ?? "none", g);
    }
    worker.current?.terminate();
    const w = new Worker(new URL("./nesting.worker.ts", import.meta.url), { type: "module" });
    worker.current = w;
    setError(null);
    setResult(null);
    setProgress({ done: 0, total: 1 });
    setSearch(null);
    w.onmessage = (e: MessageEvent) => {
      if (e.data.type === "progress") setProgress({ done: e.data.done, total: e.data.total });
      else if (e.data.type === "search")
        setSearch({ fraction: e.data.fraction, fabricName: e.data.fabricName, bestLengthMm: e.data.bestLengthMm });
      else {
        if (e.data.type === "done")
          setResult([...e.data.result].sort((a: YardageFabricResult, b: YardageFabricResult) => a.fabricName.localeCompare(b.fabricName)));
        else setError(e.data.message);
        setProgress(null);
        setSearch(null);
        w.terminate();
      }
    };
    w.postMessage({ groups: [...groups.values()], multiples });
  };

  const shown = result ?? saved.data?.fabrics ?? null;
  return (
    <div className="grid grid-cols-1 gap-4">
      <Card>
        <div className="grid gap-3 sm:grid-cols-[1fr_10rem_auto_auto] sm:items-end">
          <SelectField label="Lay out" value={scopeId} onChange={(e) => setScopeId(e.target.value)}>
            <option value={change.id}>The whole change</option>
            {change.garments.map((g) => (
              <option key={g.id} value={g.id}>
                {g.name}
              </option>
            ))}
          </SelectField>
          <InputField
            label="Multiples (copies)"
            type="number"
            min={1}
            max={20}
            value={multiples}
            onChange={(e) => setMultiples(Math.max(1, Math.min(20, Number(e.target.value) || 1)))}
          />
          <Button onClick={run} disabled={!panels.data?.length || Boolean(progress)}>
            Lay marker
          </Button>
          {canEdit && (
            <Button variant="secondary" busy={save.isPending} onClick={() => save.mutate({ scope, scopeId, multiples })}>
              Save on server
            </Button>
          )}
        </div>
        <p className="mt-2 text-xs text-slate">
          Pieces are grouped by fabric and laid across its usable width (cloth width less 25 mm selvage each side), straight-grain pieces at
          0° or 180°, bias and free pieces also crosswise; mirrored pairs alternate. After the first layout, the browser spends about 10 s
          trying other orders and turns and keeps the shortest marker; "Save on server" keeps the server's first layout.
        </p>
        {progress && (
          <div className="mt-3" role="status">
            {search ? (
              <>
                <progress className="w-full" max={1} value={search.fraction} aria-label="Nesting progress" />
                <p className="text-xs text-slate">
                  Shortening the marker: {Math.round(search.fraction * 100)} % of about 10 s · {search.fabricName}: best so far{" "}
                  {cm(search.bestLengthMm)}
                </p>
              </>
            ) : (
              <>
                <progress className="w-full" max={progress.total} value={progress.done} aria-label="Nesting progress" />
                <p className="text-xs text-slate">
                  {progress.done} of {progress.total} pieces laid
                </p>
              </>
            )}
          </div>
        )}
        {error && <ErrorAlert error={error} title="Could not lay the marker" />}
        {save.error && <ErrorAlert error={save.error} title="Not saved" />}
        {!result && saved.data && (
          <p className="mt-2 text-sm text-slate">
            Saved marker from {dateTime(saved.data.createdAt)}{" "}
            {saved.data.current ? "" : <Badge tone="warning">panels changed since</Badge>}
          </p>
        )}
      </Card>
      {shown?.map((r) => (
        <Card key={r.fabricId ?? "none"}>
          <MarkerResult r={r} />
        </Card>
      ))}
    </div>
  );
}
