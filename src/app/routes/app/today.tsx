import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/feedback";
import { SnagsForDay } from "@/features/snags/components/snags-for-day";

/** The next shoot day or performance at a glance. Features add their panels here. */
export default function TodayPage() {
  const { production, productionId, can } = useCurrentProduction();
  if (!production) return <Spinner />;
  const dates = [production.startsOn, production.endsOn].filter(Boolean).join(" – ");
  return (
    <div>
      <PageHeader title="Today" subtitle={`${production.title} · ${production.kind}${dates ? ` · ${dates}` : ""}`} />
      <Card>
        <p className="text-sm text-slate">The next {production.kind === "stage" ? "performance" : "shoot day"}, its scenes, snags, fittings and work due will show here.</p>
      </Card>
      {can("snag.read") && (
        <div className="mt-4">
          <SnagsForDay productionId={productionId} />
        </div>
      )}
    </div>
  );
}
