import { Link, Route, Routes, useParams, useSearchParams } from "react-router-dom";
import type { SnagKind } from "@shared/domain/snags/types";
import { snagKinds } from "@shared/schemas/snags";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { useMultiplesPlan, useSnags } from "@/features/snags/api/snags";
import { SnagsList, type SnagFilters } from "@/features/snags/components/snags-list";
import { MultiplesPlan } from "@/features/snags/components/multiples-plan";
import { PageHeader } from "@/components/ui/page";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { scheduleLabels } from "@shared/domain/schedule-labels";

/** Filters live in the URL so a filtered list can be shared. */
function useFilters(): [SnagFilters, (f: SnagFilters) => void] {
  const [params, setParams] = useSearchParams();
  const kind = params.get("kind") ?? "";
  const filters: SnagFilters = {
    kind: (snagKinds as readonly string[]).includes(kind) ? (kind as SnagKind) : "",
    characterId: params.get("characterId") ?? "",
    shootDayId: params.get("shootDayId") ?? "",
    includeDismissed: params.get("includeDismissed") === "true",
  };
  const set = (f: SnagFilters) => {
    const next = new URLSearchParams();
    if (f.kind) next.set("kind", f.kind);
    if (f.characterId) next.set("characterId", f.characterId);
    if (f.shootDayId) next.set("shootDayId", f.shootDayId);
    if (f.includeDismissed) next.set("includeDismissed", "true");
    setParams(next, { replace: true });
  };
  return [filters, set];
}

function SnagsOverview() {
  const { productionId, production, can } = useCurrentProduction();
  const [filters, setFilters] = useFilters();
  const q = useSnags(productionId, {
    kind: filters.kind || undefined,
    characterId: filters.characterId || undefined,
    shootDayId: filters.shootDayId || undefined,
    includeDismissed: filters.includeDismissed,
  });
  return (
    <div>
      <PageHeader
        title="Snags"
        subtitle="Conflicts in fit, continuity, multiples, bookings, rentals, check-outs, quick changes and the workroom, each with the numbers behind it."
      />
      {q.isPending ? (
        <Spinner />
      ) : q.error ? (
        <ErrorAlert error={q.error} title="Snags could not be computed" />
      ) : (
        <SnagsList
          productionId={productionId}
          kind={production?.kind ?? "film"}
          data={q.data}
          filters={filters}
          onFiltersChange={setFilters}
          canDismiss={can("snag.dismiss")}
        />
      )}
    </div>
  );
}

function MultiplesPlanPage() {
  const { productionId, production } = useCurrentProduction();
  const words = scheduleLabels(production);
  const { groupId = "" } = useParams();
  const q = useMultiplesPlan(productionId, groupId);
  const back = `/p/${productionId}/snags`;
  return (
    <div>
      <PageHeader
        title={q.data ? `Copy plan: ${q.data.groupName}` : "Copy plan"}
        subtitle={`Which copy of the group to use in which scene, ${words.day === "performance" ? "in running order" : "in shoot order"}.`}
        actions={
          <Link to={back} className="text-sm font-semibold text-ink underline-offset-2 hover:underline">
            Back to snags
          </Link>
        }
      />
      {q.isPending ? (
        <Spinner />
      ) : q.error ? (
        <ErrorAlert error={q.error} />
      ) : (
        <MultiplesPlan productionId={productionId} plan={q.data} kind={production?.kind ?? "film"} />
      )}
    </div>
  );
}

/** The Snags screen: the list, and each multiples group's copy plan under /snags/multiples/:groupId. */
export default function SnagsPage() {
  return (
    <Routes>
      <Route path="multiples/:groupId" element={<MultiplesPlanPage />} />
      <Route path="*" element={<SnagsOverview />} />
    </Routes>
  );
}
