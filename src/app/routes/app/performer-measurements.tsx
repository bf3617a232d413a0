import { useState } from "react";
import { Link, useParams } from "react-router-dom";
import { ConfirmDialog } from "@/components/ui/dialog";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { EmptyState, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { useDeleteMeasurementSet, usePerformerMeasurements } from "@/features/measurements/api/measurements";
import { MeasurementForm } from "@/features/measurements/components/measurement-form";
import { MeasurementHistory, SizesPanel } from "@/features/measurements/components/measurement-history";

/** A performer's measurements under Cast: history, sizes, a new set, and the printable sheet. */
export default function PerformerMeasurementsPage() {
  const { performerId = "" } = useParams();
  const { productionId, production, can, today } = useCurrentProduction();
  const canRead = can("measurement.read");
  const data = usePerformerMeasurements(productionId, canRead ? performerId : "");
  const del = useDeleteMeasurementSet(productionId, performerId);
  const [deleting, setDeleting] = useState<string | null>(null);
  if (!production) return <Spinner />;
  if (!canRead) {
    return (
      <Card>
        <PageHeader title="Measurements" />
        <p className="text-sm text-slate">Measurements are personal data; your role in this production does not show them.</p>
      </Card>
    );
  }
  if (data.isPending) return <Spinner />;
  if (data.error) return <ErrorAlert error={data.error} />;
  const d = data.data;
  return (
    <div className="grid gap-4">
      <PageHeader
        title={d.performer.name}
        subtitle="Measurements and sizes"
        actions={
          <Link to="print" className="rounded-md border border-ink-100 bg-white px-3 py-2 text-sm font-semibold text-ink hover:bg-ink-50">
            Printable sheet
          </Link>
        }
      />
      <Card>
        <h2 className="mb-2 font-semibold text-ink">Sizes from the newest set</h2>
        <SizesPanel data={d} />
      </Card>
      <Card>
        <h2 className="mb-2 font-semibold text-ink">History</h2>
        {d.sets.length === 0 ? (
          <EmptyState title="No measurements yet">Record the first set below.</EmptyState>
        ) : (
          <MeasurementHistory sets={d.sets} unit={production.units} onDelete={can("measurement.update") ? setDeleting : undefined} />
        )}
        {del.error && <ErrorAlert error={del.error} title="Not deleted" />}
        <ConfirmDialog
          open={Boolean(deleting)}
          title="Delete this measurement set?"
          confirmLabel="Delete set"
          danger
          busy={del.isPending}
          onCancel={() => setDeleting(null)}
          onConfirm={() => deleting && del.mutate(deleting, { onSettled: () => setDeleting(null) })}
        >
          Use this for a set entered by mistake. The history keeps every other set.
        </ConfirmDialog>
      </Card>
      {can("measurement.update") && (
        <Card>
          <h2 className="mb-2 font-semibold text-ink">New measurement set</h2>
          <MeasurementForm productionId={productionId} performerId={performerId} defaultUnit={production.units} today={today} />
        </Card>
      )}
    </div>
  );
}
