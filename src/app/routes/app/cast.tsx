import { useState } from "react";
import { Link, Route, Routes, useParams } from "react-router-dom";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { PageHeader } from "@/components/ui/page";
import { Card } from "@/components/ui/card";
import { Button } from "@/components/ui/button";
import { InputField, SelectField, TextareaField } from "@/components/ui/field";
import { Badge, ErrorAlert, Spinner } from "@/components/ui/feedback";
import { OwnerPhotos } from "@/components/photos";
import { ApiError } from "@/lib/api-client";
import {
  useCharacterSchedule,
  useCharacters,
  useCreateCharacter,
  useCreatePerformer,
  usePerformers,
  useUpdatePerformer,
} from "@/features/breakdown/api/breakdown";
import { StateBadges } from "@/features/breakdown/components/scene-page";
import type { CharacterSceneDto } from "@shared/schemas/cast";
import { scheduleLabels } from "@shared/domain/schedule-labels";
import { formatDate } from "@shared/format";

/** Cast screen: characters with performers and doubles, performer records, character pages. */
export default function CastScreen() {
  return (
    <Routes>
      <Route path="characters/:characterId" element={<CharacterRoute />} />
      <Route path="performers/:performerId" element={<PerformerRoute />} />
      <Route path="*" element={<CastHome />} />
    </Routes>
  );
}

function CastHome() {
  const { productionId, production, can } = useCurrentProduction();
  const characters = useCharacters(productionId);
  const performers = usePerformers(productionId);
  const stage = production?.kind === "stage";
  return (
    <div className="grid gap-4">
      <PageHeader title="Cast" subtitle="Characters, the performers who play them, their doubles" />
      <Card>
        <h2 className="mb-2 font-semibold text-ink">Characters</h2>
        {characters.isPending ? (
          <Spinner />
        ) : characters.error ? (
          <ErrorAlert error={characters.error} />
        ) : (
          <table className="w-full text-left text-sm" aria-label="Characters">
            <thead>
              <tr className="border-b border-chalk-200">
                <th className="py-1 pr-2">Character</th>
                <th className="py-1 pr-2">Played by</th>
                <th className="py-1">{stage ? "Understudies and doubles" : "Doubles"}</th>
              </tr>
            </thead>
            <tbody>
              {characters.data.map((c) => (
                <tr key={c.id} className="border-b border-chalk-100">
                  <td className="py-1.5 pr-2">
                    <Link
                      className="font-semibold text-ink underline-offset-2 hover:underline"
                      to={`/p/${productionId}/cast/characters/${c.id}`}
                    >
                      {c.name}
                    </Link>
                  </td>
                  <td className="pr-2">
                    {c.performer ? <Link to={`/p/${productionId}/cast/performers/${c.performer.id}`}>{c.performer.name}</Link> : "—"}
                  </td>
                  <td>
                    {c.doubles.map((d) => (
                      <span key={d.id} className="mr-2">
                        <Link to={`/p/${productionId}/cast/performers/${d.performer.id}`}>{d.performer.name}</Link>{" "}
                        <Badge tone="note">{d.kind}</Badge>
                      </span>
                    ))}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
        {can("cast.update") && <NewCharacterForm productionId={productionId} />}
      </Card>
      <Card>
        <h2 className="mb-2 font-semibold text-ink">Performers</h2>
        {performers.isPending ? (
          <Spinner />
        ) : performers.error ? (
          <ErrorAlert error={performers.error} />
        ) : (
          <ul className="grid gap-1 text-sm" aria-label="Performers">
            {performers.data.map((p) => (
              <li key={p.id}>
                <Link
                  className="font-semibold text-ink underline-offset-2 hover:underline"
                  to={`/p/${productionId}/cast/performers/${p.id}`}
                >
                  {p.name}
                </Link>{" "}
                <span className="text-slate">
                  {p.roles.map((r) => `${r.as === "performer" ? "" : `${r.as} for `}${r.characterName}`).join("; ")}
                </span>
              </li>
            ))}
          </ul>
        )}
        {can("cast.update") && <NewPerformerForm productionId={productionId} />}
      </Card>
    </div>
  );
}

function NewCharacterForm({ productionId }: { productionId: string }) {
  const create = useCreateCharacter(productionId);
  const performers = usePerformers(productionId);
  const [name, setName] = useState("");
  const [performerId, setPerformerId] = useState("");
  const fields = create.error instanceof ApiError ? create.error.fields : {};
  return (
    <form
      className="mt-3 grid gap-2 border-t border-chalk-200 pt-3 sm:grid-cols-3"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate({ name, performerId: performerId || null }, { onSuccess: () => setName("") });
      }}
    >
      <InputField label="New character" value={name} onChange={(e) => setName(e.target.value)} error={fields.name} required />
      <SelectField label="Played by" value={performerId} onChange={(e) => setPerformerId(e.target.value)}>
        <option value="">—</option>
        {performers.data?.map((p) => (
          <option key={p.id} value={p.id}>
            {p.name}
          </option>
        ))}
      </SelectField>
      <div className="flex items-end">
        <Button type="submit" busy={create.isPending}>
          Add character
        </Button>
      </div>
    </form>
  );
}

function NewPerformerForm({ productionId }: { productionId: string }) {
  const create = useCreatePerformer(productionId);
  const [name, setName] = useState("");
  const fields = create.error instanceof ApiError ? create.error.fields : {};
  return (
    <form
      className="mt-3 flex flex-wrap items-end gap-2 border-t border-chalk-200 pt-3"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate({ name }, { onSuccess: () => setName("") });
      }}
    >
      <InputField label="New performer" value={name} onChange={(e) => setName(e.target.value)} error={fields.name} required />
      <Button type="submit" busy={create.isPending}>
        Add performer
      </Button>
    </form>
  );
}

function SceneList({
  rows,
  productionId,
  showDay,
  label,
}: {
  rows: Array<CharacterSceneDto & { shootDay?: { dayNumber: number; date: string } }>;
  productionId: string;
  showDay?: boolean;
  label: string;
}) {
  const { production } = useCurrentProduction();
  return (
    <table className="w-full text-left text-sm" aria-label={label}>
      <thead>
        <tr className="border-b border-chalk-200">
          {showDay && <th className="py-1 pr-2">{scheduleLabels(production).Day}</th>}
          <th className="py-1 pr-2">Scene</th>
          <th className="py-1 pr-2">Story day</th>
          <th className="py-1 pr-2">Change</th>
          <th className="py-1">State</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r, i) => (
          <tr key={`${r.appearanceId}-${i}`} className="border-b border-chalk-100">
            {showDay && (
              <td className="py-1 pr-2">
                {r.shootDay ? `${scheduleLabels(production).numbered(r.shootDay.dayNumber)} · ${formatDate(r.shootDay.date)}` : ""}
              </td>
            )}
            <td className="py-1 pr-2">
              <Link to={`/p/${productionId}/breakdown/scenes/${r.sceneId}`}>{r.sceneNumber}</Link>
            </td>
            <td className="pr-2">{r.storyDay ?? "—"}</td>
            <td className="pr-2">{r.change ? r.change.number : "—"}</td>
            <td>
              <StateBadges a={r} />
              {r.minutesSincePreviousExit != null && (
                <span className="ml-1 text-xs text-slate">{r.minutesSincePreviousExit} min since last exit</span>
              )}
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

function CharacterRoute() {
  const { characterId = "" } = useParams();
  const { productionId, production, can } = useCurrentProduction();
  const schedule = useCharacterSchedule(productionId, characterId);
  if (schedule.isPending) return <Spinner />;
  if (schedule.error) return <ErrorAlert error={schedule.error} />;
  const { character, storyOrder, shootOrder } = schedule.data;
  const stage = production?.kind === "stage";
  return (
    <div className="grid gap-4">
      <PageHeader
        title={character.name}
        subtitle={<Link to={`/p/${productionId}/cast`}>← Cast</Link>}
        actions={
          <Link className="font-semibold text-ink underline" to={`/p/${productionId}/continuity/timeline/${character.id}`}>
            Continuity timeline
          </Link>
        }
      />
      <Card>
        <p className="text-sm">
          Played by{" "}
          {character.performer ? (
            <Link to={`/p/${productionId}/cast/performers/${character.performer.id}`}>{character.performer.name}</Link>
          ) : (
            "—"
          )}
          {character.doubles.map((d) => ` · ${d.kind}: ${d.performer.name}`)}
        </p>
        {character.notes && <p className="mt-1 text-sm text-slate">{character.notes}</p>}
      </Card>
      <Card>
        <h2 className="mb-2 font-semibold text-ink">{stage ? "Scenes in running order" : "Scenes in story order"}</h2>
        <SceneList rows={storyOrder} productionId={productionId} label="Story order" />
      </Card>
      {!stage && (
        <Card>
          <h2 className="mb-2 font-semibold text-ink">Scenes in shoot order</h2>
          <SceneList rows={shootOrder} productionId={productionId} showDay label="Shoot order" />
        </Card>
      )}
      <Card>
        <OwnerPhotos
          productionId={productionId}
          ownerType="character"
          ownerId={character.id}
          canEdit={can("cast.update")}
          title="Character reference photos"
        />
      </Card>
    </div>
  );
}

function PerformerRoute() {
  const { performerId = "" } = useParams();
  const { productionId, can } = useCurrentProduction();
  const performers = usePerformers(productionId);
  const update = useUpdatePerformer(productionId, performerId);
  const p = performers.data?.find((x) => x.id === performerId);
  if (performers.isPending) return <Spinner />;
  if (!p) return <ErrorAlert error={new Error("Performer not found.")} />;
  const fields = update.error instanceof ApiError ? update.error.fields : {};
  const editable = can("cast.update");
  return (
    <div className="grid gap-4">
      <PageHeader title={p.name} subtitle={<Link to={`/p/${productionId}/cast`}>← Cast</Link>} />
      <Card>
        <form
          className="grid gap-2 sm:grid-cols-2"
          onSubmit={(e) => {
            e.preventDefault();
            const f = new FormData(e.currentTarget);
            update.mutate({
              name: String(f.get("name")),
              email: String(f.get("email") ?? "") || null,
              phone: String(f.get("phone") ?? "") || null,
              agentContact: String(f.get("agentContact") ?? "") || null,
              notes: String(f.get("notes") ?? "") || null,
            });
          }}
        >
          <InputField label="Name" name="name" defaultValue={p.name} error={fields.name} disabled={!editable} required />
          <InputField label="E-mail" name="email" type="email" defaultValue={p.email ?? ""} error={fields.email} disabled={!editable} />
          <InputField label="Phone" name="phone" defaultValue={p.phone ?? ""} error={fields.phone} disabled={!editable} />
          <InputField
            label="Agent / contact"
            name="agentContact"
            defaultValue={p.agentContact ?? ""}
            error={fields.agentContact}
            disabled={!editable}
          />
          <TextareaField label="Notes" name="notes" defaultValue={p.notes ?? ""} className="sm:col-span-2" disabled={!editable} />
          {editable && (
            <div>
              <Button type="submit" busy={update.isPending}>
                Save
              </Button>
              {update.isSuccess && (
                <span role="status" className="ml-2 text-sm">
                  Saved.
                </span>
              )}
            </div>
          )}
        </form>
        <p className="mt-3 text-sm">
          Plays: {p.roles.map((r) => `${r.characterName}${r.as === "performer" ? "" : ` (${r.as})`}`).join(", ") || "—"}
        </p>
      </Card>
      <Card>
        <h2 className="font-semibold text-ink">Measurements</h2>
        {can("measurement.read") ? (
          <Link className="text-sm font-semibold text-ink underline" to={`/p/${productionId}/cast/performers/${p.id}/measurements`}>
            Measurement history and sizes →
          </Link>
        ) : (
          <p className="text-sm text-slate">Measurements are personal data; your role does not open them.</p>
        )}
      </Card>
      {can("measurement.read") && (
        <Card>
          <OwnerPhotos
            productionId={productionId}
            ownerType="performer"
            ownerId={p.id}
            canEdit={can("measurement.update")}
            title="Fitting reference photos (personal data)"
          />
        </Card>
      )}
    </div>
  );
}
