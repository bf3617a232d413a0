import { useState, type FormEvent } from "react";
import { garmentSources } from "@shared/schemas/garments";
import { Button } from "@/components/ui/button";
import { ErrorAlert, Spinner } from "@/components/ui/feedback";
import { InputField, SelectField } from "@/components/ui/field";
import { ApiError } from "@/lib/api-client";
import { cn } from "@/utils/cn";
import { useGarmentSearch, useLinkFittingItem } from "../api/workroom";

/**
 * For a change item with no garment yet, at the fitting: find the garment in stock by tag code or
 * name, or add it to stock here, and link it. `onLinked` gets the garment id (to raise a ticket next).
 */
export function LinkGarment(props: {
  productionId: string;
  fittingId: string;
  changeItemId: string;
  itemLabel: string;
  onLinked: (garmentId: string) => void;
  onCancel: () => void;
}) {
  const [mode, setMode] = useState<"find" | "new">("find");
  const [q, setQ] = useState("");
  const search = useGarmentSearch(props.productionId, q);
  const link = useLinkFittingItem(props.productionId);
  const [g, setG] = useState({
    name: props.itemLabel,
    category: "",
    sizeLabel: "",
    colour: "",
    source: "built" as (typeof garmentSources)[number],
  });
  const [local, setLocal] = useState<Record<string, string>>({});
  const server = link.error instanceof ApiError ? link.error.fields : {};
  const fieldError = (k: string) => local[k] ?? server[`newGarment.${k}`];
  const done = (res: { items: Array<{ changeItemId: string; garmentId: string | null }> }) => {
    const gid = res.items.find((i) => i.changeItemId === props.changeItemId)?.garmentId;
    if (gid) props.onLinked(gid);
  };
  const create = (e: FormEvent) => {
    e.preventDefault();
    const errs: Record<string, string> = {};
    if (!g.name.trim()) errs.name = "Name the garment.";
    if (!g.category.trim()) errs.category = "Give a category, such as scarf or jacket.";
    setLocal(errs);
    if (Object.keys(errs).length) return;
    link.mutate(
      {
        fittingId: props.fittingId,
        changeItemId: props.changeItemId,
        newGarment: { name: g.name, category: g.category, sizeLabel: g.sizeLabel || null, colour: g.colour || null, source: g.source },
      },
      { onSuccess: done },
    );
  };
  const tab = (m: "find" | "new", label: string) => (
    <button
      type="button"
      aria-pressed={mode === m}
      onClick={() => setMode(m)}
      className={cn(
        "min-h-11 rounded-md px-3 text-sm font-semibold",
        mode === m ? "bg-ink text-chalk" : "border border-ink-100 bg-white text-ink",
      )}
    >
      {label}
    </button>
  );
  return (
    <div
      className="grid gap-3 rounded-md border border-ink-100 bg-chalk p-3"
      role="group"
      aria-label={`Link a garment to ${props.itemLabel}`}
    >
      <div className="flex flex-wrap gap-2">
        {tab("find", "Find in stock")}
        {tab("new", "Add a new garment")}
      </div>
      {mode === "find" ? (
        <div className="grid gap-2">
          <InputField
            label="Tag code or name"
            value={q}
            autoFocus
            onChange={(e) => setQ(e.target.value)}
            hint="At least two letters or digits."
          />
          {search.isFetching && <Spinner label="Searching…" />}
          {search.error && <ErrorAlert error={search.error} />}
          {search.data && search.data.length === 0 && (
            <p className="text-sm text-slate">Nothing in stock matches “{q}”. Add it as a new garment instead.</p>
          )}
          {search.data && search.data.length > 0 && (
            <ul className="grid gap-1" aria-label="Garments found">
              {search.data.map((x) => (
                <li
                  key={x.id}
                  className="flex flex-wrap items-center justify-between gap-2 rounded border border-chalk-200 bg-white p-2 text-sm"
                >
                  <span>
                    <span className="font-semibold">{x.tagCode}</span> {x.name}
                    <span className="text-slate">
                      {" "}
                      · {x.category}
                      {x.sizeLabel ? ` · ${x.sizeLabel}` : ""} · {x.status.replace("_", " ")}
                    </span>
                  </span>
                  <Button
                    size="lg"
                    busy={link.isPending && link.variables?.garmentId === x.id}
                    onClick={() =>
                      link.mutate({ fittingId: props.fittingId, changeItemId: props.changeItemId, garmentId: x.id }, { onSuccess: done })
                    }
                    aria-label={`Link ${x.tagCode} ${x.name}`}
                  >
                    Link
                  </Button>
                </li>
              ))}
            </ul>
          )}
        </div>
      ) : (
        <form onSubmit={create} className="grid gap-2 sm:grid-cols-2" aria-label="New garment">
          <InputField label="Name" value={g.name} onChange={(e) => setG({ ...g, name: e.target.value })} error={fieldError("name")} />
          <InputField
            label="Category"
            placeholder="scarf, jacket, boots…"
            value={g.category}
            onChange={(e) => setG({ ...g, category: e.target.value })}
            error={fieldError("category")}
          />
          <InputField
            label="Size"
            value={g.sizeLabel}
            onChange={(e) => setG({ ...g, sizeLabel: e.target.value })}
            error={fieldError("sizeLabel")}
          />
          <InputField
            label="Colour"
            value={g.colour}
            onChange={(e) => setG({ ...g, colour: e.target.value })}
            error={fieldError("colour")}
          />
          <SelectField label="Source" value={g.source} onChange={(e) => setG({ ...g, source: e.target.value as typeof g.source })}>
            {garmentSources.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </SelectField>
          <div className="flex items-end">
            <Button type="submit" size="lg" busy={link.isPending}>
              Add to stock and link
            </Button>
          </div>
          <p className="text-xs text-slate sm:col-span-2">
            The app makes its tag code; fill in measurements, fabric and location later on Wardrobe.
          </p>
        </form>
      )}
      {link.error && !Object.keys(server).some((k) => k.startsWith("newGarment.")) && <ErrorAlert error={link.error} title="Not linked" />}
      <div>
        <Button variant="ghost" onClick={props.onCancel}>
          Close
        </Button>
      </div>
    </div>
  );
}
