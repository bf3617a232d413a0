import { useCallback, useState } from "react";
import { Link, Route, Routes, useNavigate, useParams } from "react-router-dom";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { InputField, SelectField } from "@/components/ui/field";
import { ErrorAlert, Spinner, EmptyState } from "@/components/ui/feedback";
import { OwnerPhotos } from "@/components/photos";
import { useChanges, useCharacters, useCreateScene, useScene, useScenes, useShootDays } from "@/features/breakdown/api/breakdown";
import { BreakdownTable } from "@/features/breakdown/components/breakdown-table";
import { ImportPanel } from "@/features/breakdown/components/import-panel";
import { ScenePage } from "@/features/breakdown/components/scene-page";
import { SceneForm } from "@/features/breakdown/components/scene-form";
import { ShootDayEditor } from "@/features/breakdown/components/shoot-day-editor";
import { SnagsForDay } from "@/features/snags/components/snags-for-day";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/utils/cn";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { onTabListKeyDown } from "@/components/ui/tabs";

/** Breakdown screen: the scene table, shoot days (or running order and performances), import/export, scene pages. */
export default function BreakdownScreen() {
  return (
    <Routes>
      <Route path="scenes/:sceneId" element={<SceneRoute />} />
      <Route path="*" element={<BreakdownHome />} />
    </Routes>
  );
}

function BreakdownHome() {
  const { productionId, production, can } = useCurrentProduction();
  const stage = production?.kind === "stage";
  const scenes = useScenes(productionId);
  const days = useShootDays(productionId);
  const characters = useCharacters(productionId);
  const [tab, setTab] = useState<"scenes" | "days" | "csv">("scenes");
  const sceneHref = useCallback((id: string) => `/p/${productionId}/breakdown/scenes/${id}`, [productionId]);
  const tabs = [
    { key: "scenes", label: stage ? "Running order" : "Scenes" },
    { key: "days", label: scheduleLabels(production).Days },
    { key: "csv", label: "Import / export" },
  ] as const;
  return (
    <div className="grid gap-4">
      <PageHeader
        title="Breakdown"
        subtitle={
          stage ? "The order of the show, running times and performances" : `Scenes, story days and ${scheduleLabels(production).days}`
        }
      />
      <div role="tablist" aria-label="Breakdown views" tabIndex={-1} onKeyDown={onTabListKeyDown} className="flex gap-1">
        {tabs.map((t) => (
          <button
            key={t.key}
            role="tab"
            type="button"
            aria-selected={tab === t.key}
            onClick={() => setTab(t.key)}
            className={cn("min-h-11 rounded-md px-3 text-sm font-semibold", tab === t.key ? "bg-ink text-chalk" : "bg-white text-ink")}
          >
            {t.label}
          </button>
        ))}
      </div>
      {tab === "scenes" && (
        <Card>
          {scenes.isPending || days.isPending || characters.isPending ? (
            <Spinner />
          ) : scenes.error ? (
            <ErrorAlert error={scenes.error} />
          ) : scenes.data.length === 0 ? (
            <EmptyState title="No scenes yet">Add scenes one by one below or import a CSV file.</EmptyState>
          ) : (
            <BreakdownTable
              scenes={scenes.data}
              shootDays={days.data ?? []}
              characters={characters.data ?? []}
              stage={stage}
              sceneHref={sceneHref}
            />
          )}
          {can("breakdown.update") && <NewSceneForm productionId={productionId} stage={stage} />}
        </Card>
      )}
      {tab === "days" && (
        <Card>
          {days.isPending || scenes.isPending ? (
            <Spinner />
          ) : days.error ? (
            <ErrorAlert error={days.error} />
          ) : scenes.error ? (
            <ErrorAlert error={scenes.error} />
          ) : (
            <ShootDayEditor
              productionId={productionId}
              days={days.data}
              scenes={scenes.data}
              stage={stage}
              canEdit={can("breakdown.update")}
              today={production?.today ?? ""}
              sceneHref={sceneHref}
              daySnags={can("snag.read") ? (d) => <SnagsForDay productionId={productionId} day={d} /> : undefined}
            />
          )}
        </Card>
      )}
      {tab === "csv" && (
        <Card>
          <ImportPanel productionId={productionId} canImport={can("breakdown.import")} />
        </Card>
      )}
    </div>
  );
}

function NewSceneForm({ productionId, stage }: { productionId: string; stage: boolean }) {
  const create = useCreateScene(productionId);
  const [v, setV] = useState({ number: "", setName: "", intExt: "", storyDay: "", length: "" });
  const fields = create.error instanceof ApiError ? create.error.fields : {};
  return (
    <form
      className="mt-4 grid grid-cols-2 gap-2 border-t border-chalk-200 pt-3 sm:grid-cols-6"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate(
          {
            number: v.number,
            setName: v.setName || null,
            intExt: (v.intExt || null) as never,
            storyDay: v.storyDay ? Number(v.storyDay) : null,
            ...(stage ? { runningMinutes: v.length ? Number(v.length) : null } : { lengthEighths: v.length ? Number(v.length) : null }),
          },
          { onSuccess: () => setV({ number: "", setName: "", intExt: "", storyDay: "", length: "" }) },
        );
      }}
    >
      <InputField label="Scene" value={v.number} onChange={(e) => setV({ ...v, number: e.target.value })} error={fields.number} required />
      <InputField label="Set" value={v.setName} onChange={(e) => setV({ ...v, setName: e.target.value })} error={fields.setName} />
      <SelectField label="I/E" value={v.intExt} onChange={(e) => setV({ ...v, intExt: e.target.value })}>
        <option value="">—</option>
        <option>INT</option>
        <option>EXT</option>
        <option>INT/EXT</option>
      </SelectField>
      <InputField
        label="Story day"
        type="number"
        min={1}
        value={v.storyDay}
        onChange={(e) => setV({ ...v, storyDay: e.target.value })}
        error={fields.storyDay}
      />
      <InputField
        label={stage ? "Minutes" : "Eighths"}
        type="number"
        min={0}
        step={stage ? 0.5 : 1}
        value={v.length}
        onChange={(e) => setV({ ...v, length: e.target.value })}
        error={fields.lengthEighths ?? fields.runningMinutes}
      />
      <div className="flex items-end">
        <Button type="submit" busy={create.isPending}>
          Add scene
        </Button>
      </div>
      {create.error && !Object.keys(fields).length && <ErrorAlert error={create.error} />}
    </form>
  );
}

function SceneRoute() {
  const { sceneId = "" } = useParams();
  const navigate = useNavigate();
  const { productionId, production, can } = useCurrentProduction();
  const scene = useScene(productionId, sceneId);
  const [editing, setEditing] = useState(false);
  const characters = useCharacters(productionId);
  const changes = useChanges(productionId);
  if (scene.isPending) return <Spinner />;
  if (scene.error) return <ErrorAlert error={scene.error} />;
  return (
    <div className="grid gap-4">
      <PageHeader
        title={`Scene ${scene.data.number}`}
        subtitle={<Link to={`/p/${productionId}/breakdown`}>← Breakdown</Link>}
        actions={
          can("breakdown.update") ? (
            <Button variant="secondary" aria-expanded={editing} onClick={() => setEditing((e) => !e)}>
              {editing ? "Close the form" : "Edit scene"}
            </Button>
          ) : undefined
        }
      />
      {editing && can("breakdown.update") && (
        <Card>
          <SceneForm
            key={scene.data.id}
            productionId={productionId}
            scene={scene.data}
            stage={production?.kind === "stage"}
            onDeleted={() => navigate(`/p/${productionId}/breakdown`)}
          />
        </Card>
      )}
      <Card>
        <ScenePage
          productionId={productionId}
          scene={scene.data}
          characters={characters.data ?? []}
          changes={changes.data ?? []}
          canEdit={can("breakdown.update")}
          stage={production?.kind === "stage"}
          characterHref={(id) => `/p/${productionId}/cast/characters/${id}`}
        />
      </Card>
      <Card>
        <OwnerPhotos
          productionId={productionId}
          ownerType="scene"
          ownerId={scene.data.id}
          canEdit={can("breakdown.update")}
          title="Scene reference photos"
        />
      </Card>
    </div>
  );
}
