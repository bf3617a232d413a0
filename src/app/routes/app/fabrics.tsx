import { useState } from "react";
import { Link, Route, Routes, useParams } from "react-router-dom";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { formatLength } from "@shared/domain/units";
import { useCreateFabric, useFabric, useFabrics, useUpdateFabric } from "@/features/fabrics/api/fabrics";
import { FabricForm } from "@/features/fabrics/components/fabric-form";
import { FabricTests } from "@/features/fabrics/components/fabric-tests";
import { OwnerPhotos } from "@/components/photos";

function FabricLibrary() {
  const { productionId, production, can } = useCurrentProduction();
  const fabrics = useFabrics(productionId);
  const create = useCreateFabric(productionId);
  const [adding, setAdding] = useState(false);
  if (!production) return <Spinner />;
  return (
    <div className="grid gap-4">
      <PageHeader
        title="Fabrics"
        subtitle="The fabric library and its tests"
        actions={can("fabric.update") && !adding ? <Button onClick={() => setAdding(true)}>Add fabric</Button> : undefined}
      />
      {adding && (
        <Card>
          <FabricForm
            unit={production.units}
            busy={create.isPending}
            error={create.error}
            submitLabel="Add fabric"
            onSubmit={(v) => create.mutate(v, { onSuccess: () => setAdding(false) })}
          />
        </Card>
      )}
      {fabrics.isPending ? (
        <Spinner />
      ) : fabrics.error ? (
        <ErrorAlert error={fabrics.error} />
      ) : fabrics.data.length === 0 ? (
        <EmptyState title="No fabrics yet">Add the cloths the department buys and tests.</EmptyState>
      ) : (
        <div className="overflow-x-auto rounded-lg border border-chalk-200 bg-white">
          <table className="w-full text-left text-sm" aria-label="Fabrics">
            <thead className="border-b border-chalk-200 text-xs uppercase tracking-wide text-slate">
              <tr>
                <th className="px-2 py-2">Name</th>
                <th className="px-2 py-2">Content</th>
                <th className="px-2 py-2">Construction</th>
                <th className="px-2 py-2">Width</th>
                <th className="px-2 py-2">Weight</th>
                <th className="px-2 py-2">Stretch warp / weft</th>
                <th className="px-2 py-2">Supplier</th>
                <th className="px-2 py-2">Tests</th>
                <th className="px-2 py-2">Garments</th>
              </tr>
            </thead>
            <tbody>
              {fabrics.data.map((f) => (
                <tr key={f.id} className="border-b border-chalk-200 last:border-0">
                  <td className="px-2 py-1.5">
                    <Link to={f.id} className="font-semibold text-ink underline-offset-2 hover:underline">
                      {f.name}
                    </Link>
                  </td>
                  <td className="px-2 py-1.5">{f.fibreContent.map((x) => `${x.percent} % ${x.fibre}`).join(", ")}</td>
                  <td className="px-2 py-1.5">{f.construction}</td>
                  <td className="px-2 py-1.5 whitespace-nowrap">{f.widthMm ? formatLength(f.widthMm, production.units) : "—"}</td>
                  <td className="px-2 py-1.5 whitespace-nowrap">
                    {f.massPerAreaGsm ? `${f.massPerAreaGsm} g/m² (${f.massPerAreaOzYd2} oz/yd²)` : "—"}
                  </td>
                  <td className="px-2 py-1.5">
                    {f.stretchWarpPct != null || f.stretchWeftPct != null
                      ? `${f.stretchWarpPct ?? "—"} % / ${f.stretchWeftPct ?? "—"} %`
                      : "—"}
                  </td>
                  <td className="px-2 py-1.5">{f.supplier ?? "—"}</td>
                  <td className="px-2 py-1.5">{f.testCount}</td>
                  <td className="px-2 py-1.5">{f.garmentCount}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}

function FabricPage() {
  const { fabricId = "" } = useParams();
  const { productionId, production, can, today } = useCurrentProduction();
  const fabric = useFabric(productionId, fabricId);
  const update = useUpdateFabric(productionId, fabricId);
  const [editing, setEditing] = useState(false);
  if (!production || fabric.isPending) return <Spinner />;
  if (fabric.error) return <ErrorAlert error={fabric.error} />;
  const f = fabric.data;
  return (
    <div className="grid gap-4">
      <PageHeader
        title={f.name}
        subtitle={
          <Link to=".." relative="path" className="underline">
            Back to the fabric library
          </Link>
        }
      />
      <Card>
        <OwnerPhotos
          productionId={productionId}
          ownerType="fabric"
          ownerId={fabricId}
          canEdit={can("fabric.update")}
          title="Swatch photos"
        />
      </Card>
      <Card>
        {editing ? (
          <FabricForm
            unit={production.units}
            initial={f}
            busy={update.isPending}
            error={update.error}
            submitLabel="Save fabric"
            onSubmit={(v) => update.mutate(v, { onSuccess: () => setEditing(false) })}
          />
        ) : (
          <div className="grid gap-1 text-sm">
            <p>
              <strong>{f.fibreContent.map((x) => `${x.percent} % ${x.fibre}`).join(", ")}</strong> · {f.construction}
              {f.widthMm ? ` · ${formatLength(f.widthMm, production.units)} wide` : ""}
              {f.colour ? ` · ${f.colour}` : ""}
            </p>
            <p>
              {f.massPerAreaGsm ? `${f.massPerAreaGsm} g/m² (${f.massPerAreaOzYd2} oz/yd²) declared` : "No declared weight"}
              {f.thicknessMm ? ` · ${f.thicknessMm} mm thick` : ""}
              {f.stretchWarpPct != null || f.stretchWeftPct != null
                ? ` · stretch ${f.stretchWarpPct ?? "—"} % warp, ${f.stretchWeftPct ?? "—"} % weft`
                : ""}
            </p>
            {f.supplier && <p>Supplier: {f.supplier}</p>}
            {f.careNotes && <p className="whitespace-pre-line text-slate">Care: {f.careNotes}</p>}
            {can("fabric.update") && (
              <div className="mt-2">
                <Button size="sm" variant="secondary" onClick={() => setEditing(true)}>
                  Edit
                </Button>
              </div>
            )}
          </div>
        )}
      </Card>
      <Card>
        <FabricTests productionId={productionId} fabric={f} canUpdate={can("fabric.update")} today={today} />
      </Card>
    </div>
  );
}

/** Fabrics screen: the library and one fabric's tests. */
export default function FabricsScreen() {
  return (
    <Routes>
      <Route index element={<FabricLibrary />} />
      <Route path=":fabricId" element={<FabricPage />} />
    </Routes>
  );
}
