import { useState } from "react";
import { Link, Route, Routes, useNavigate, useParams, useSearchParams } from "react-router-dom";
import { garmentStatuses, type GarmentStatus } from "@shared/schemas/garments";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { SelectField } from "@/components/ui/field";
import { GarmentsTable } from "@/features/wardrobe/components/garments-table";
import { GarmentDetail } from "@/features/wardrobe/components/garment-detail";
import { GarmentForm } from "@/features/wardrobe/components/garment-form";
import { CheckInOut } from "@/features/wardrobe/components/check-in-out";
import { LabelPositionSelect } from "@/features/wardrobe/components/label-position";
import { garmentFileUrls, useCreateGarment, useFabricOptions, useGarment, useGarmentFilterOptions } from "@/features/wardrobe/api/garments";
import { OwnerPhotos } from "@/components/photos";

const linkButton = "rounded-md border border-ink-100 bg-white px-3 py-2 text-sm font-semibold text-ink hover:bg-ink-50";

function WardrobeList() {
  const { productionId, production, can } = useCurrentProduction();
  if (!production) return <Spinner />;
  return (
    <div>
      <PageHeader
        title="Wardrobe"
        subtitle="Every garment, where it is, and where it has been"
        actions={
          <>
            {can("garment.move") && (
              <Link to="scan" className={linkButton}>
                Check in / out
              </Link>
            )}
            <Link to="tags" className={linkButton}>
              Tag sheet
            </Link>
            {can("garment.update") && (
              <Link to="new" className="rounded-md bg-ink px-3 py-2 text-sm font-semibold text-chalk hover:bg-ink-700">
                Add garment
              </Link>
            )}
          </>
        }
      />
      <GarmentsTable productionId={productionId} unit={production.units} canMove={can("garment.move")} />
    </div>
  );
}

function GarmentPage() {
  const { garmentId = "" } = useParams();
  const { productionId, production, can } = useCurrentProduction();
  const garment = useGarment(productionId, garmentId);
  return (
    <div>
      <PageHeader
        title="Garment"
        subtitle={
          <Link to="../.." relative="path" className="underline">
            Back to the wardrobe
          </Link>
        }
      />
      {can("photo.read") && (
        <Card className="mb-4">
          <OwnerPhotos
            productionId={productionId}
            ownerType="garment"
            ownerId={garmentId}
            canEdit={can("garment.update")}
            title="Garment photos"
          />
        </Card>
      )}
      {garment.isPending || !production ? (
        <Spinner />
      ) : garment.error ? (
        <ErrorAlert error={garment.error} />
      ) : (
        <GarmentDetail
          productionId={productionId}
          garment={garment.data}
          unit={production.units}
          kind={production.kind}
          canUpdate={can("garment.update")}
          canMove={can("garment.move")}
          canReadFabrics={can("fabric.read")}
        />
      )}
    </div>
  );
}

function NewGarmentPage() {
  const { productionId, production, can } = useCurrentProduction();
  const create = useCreateGarment(productionId);
  const fabrics = useFabricOptions(productionId, can("fabric.read"));
  const navigate = useNavigate();
  if (!production) return <Spinner />;
  return (
    <div>
      <PageHeader
        title="Add garment"
        subtitle={
          <Link to=".." relative="path" className="underline">
            Back to the wardrobe
          </Link>
        }
      />
      <Card>
        <GarmentForm
          unit={production.units}
          fabrics={fabrics.data ?? []}
          allowCopies
          busy={create.isPending}
          error={create.error}
          submitLabel="Add garment"
          onSubmit={(v) => create.mutate(v, { onSuccess: (rows) => void navigate(`../garments/${rows[0]!.id}`, { relative: "path" }) })}
        />
      </Card>
    </div>
  );
}

function TagSheetPage() {
  const { productionId } = useCurrentProduction();
  const options = useGarmentFilterOptions(productionId);
  const [rack, setRack] = useState("");
  const [category, setCategory] = useState("");
  const [start, setStart] = useState(1);
  return (
    <div>
      <PageHeader
        title="Tag sheet"
        subtitle={
          <Link to=".." relative="path" className="underline">
            Back to the wardrobe
          </Link>
        }
      />
      <Card className="grid max-w-xl gap-3">
        <p className="text-sm text-slate">
          An A4 sheet of 3 × 8 labels (70 × 37 mm). Each label has a QR code holding only the tag code, so a phone or a USB scanner types it
          into Check in / out. To print a hand-picked set, tick garments in the wardrobe table and use its Tag labels link.
        </p>
        <SelectField label="Rack" value={rack} onChange={(e) => setRack(e.target.value)}>
          <option value="">All racks</option>
          {options.data?.racks.map((r) => (
            <option key={r}>{r}</option>
          ))}
        </SelectField>
        <SelectField label="Category" value={category} onChange={(e) => setCategory(e.target.value)}>
          <option value="">All categories</option>
          {options.data?.categories.map((c) => (
            <option key={c}>{c}</option>
          ))}
        </SelectField>
        <LabelPositionSelect value={start} onChange={setStart} />
        <p className="-mt-2 text-xs text-slate">
          On a partly used sheet, choose the first free label; the rest of the sheet fills from there and further sheets start at the top
          left.
        </p>
        <a
          className="rounded-md bg-ink px-3 py-2 text-center text-sm font-semibold text-chalk hover:bg-ink-700"
          target="_blank"
          rel="noreferrer"
          href={garmentFileUrls.labels(productionId, { rack: rack || undefined, category: category || undefined }, start)}
        >
          Open label sheet (PDF)
        </a>
      </Card>
    </div>
  );
}

function ScanPage() {
  const { productionId, production } = useCurrentProduction();
  // A rack-list QR code opens this page with ?tag=…&to=on_set.
  const [params] = useSearchParams();
  const to = params.get("to");
  const initialStatus = (garmentStatuses as readonly string[]).includes(to ?? "") ? (to as GarmentStatus) : undefined;
  return (
    <div>
      <PageHeader
        title="Check in / out"
        subtitle={
          <Link to=".." relative="path" className="underline">
            Back to the wardrobe
          </Link>
        }
      />
      <CheckInOut
        key={params.toString()}
        productionId={productionId}
        kind={production?.kind ?? "film"}
        initialTag={params.get("tag")?.slice(0, 20) || undefined}
        initialStatus={initialStatus}
      />
    </div>
  );
}

/** Wardrobe screen: the garment table and its sub-pages. */
export default function WardrobeScreen() {
  return (
    <Routes>
      <Route index element={<WardrobeList />} />
      <Route path="garments/:garmentId" element={<GarmentPage />} />
      <Route path="new" element={<NewGarmentPage />} />
      <Route path="tags" element={<TagSheetPage />} />
      <Route path="scan" element={<ScanPage />} />
      <Route path="*" element={<WardrobeList />} />
    </Routes>
  );
}
