import { useRef, useState } from "react";

interface Props {
  /** The production open now. */
  productionId: string;
  productions: ReadonlyArray<{ productionId: string; title: string }>;
  onOpen: (productionId: string) => void;
  onNew: () => void;
}

const NEW = "__new";

/**
 * The header's production switcher. A choice made with the pointer opens at once; a choice made with the
 * keyboard (arrow keys on a closed list change its value one step at a time) waits until the person presses
 * Enter or "Open", and Escape puts the list back, so stepping through the list never switches production.
 */
export function ProductionSwitcher({ productionId, productions, onOpen, onNew }: Props) {
  const [choice, setChoice] = useState(productionId);
  const lastInput = useRef<"pointer" | "keyboard">("pointer");
  // Another production opened (from elsewhere): the choice follows it. Adjusted while rendering, as
  // React advises for state that follows a prop.
  const [shownFor, setShownFor] = useState(productionId);
  if (shownFor !== productionId) {
    setShownFor(productionId);
    setChoice(productionId);
  }
  const pending = choice !== productionId;
  const go = (id: string) => (id === NEW ? onNew() : onOpen(id));
  const title = (id: string) =>
    id === NEW ? "a new production" : (productions.find((p) => p.productionId === id)?.title ?? "that production");

  return (
    <form
      className="flex min-w-0 flex-1 items-center gap-1 sm:flex-none"
      aria-label="Switch production"
      onSubmit={(e) => {
        e.preventDefault();
        if (pending) go(choice);
      }}
    >
      <label className="sr-only" htmlFor="production-switcher">
        Production
      </label>
      <select
        id="production-switcher"
        aria-describedby={pending ? "production-switcher-hint" : undefined}
        className="min-w-0 max-w-[14rem] flex-1 truncate rounded-md border border-chalk/30 bg-ink-700 px-2 py-1 text-sm text-chalk focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-chalk focus-visible:outline-solid"
        value={choice}
        onPointerDown={() => (lastInput.current = "pointer")}
        onKeyDown={(e) => {
          lastInput.current = "keyboard";
          if (e.key === "Escape" && pending) {
            e.preventDefault();
            setChoice(productionId);
          } else if (e.key === "Enter") {
            e.preventDefault();
            if (pending) go(choice);
          }
        }}
        onChange={(e) => {
          const id = e.target.value;
          if (lastInput.current === "pointer") go(id);
          else setChoice(id);
        }}
      >
        {productions.map((m) => (
          <option key={m.productionId} value={m.productionId}>
            {m.title}
          </option>
        ))}
        <option value={NEW}>+ New production…</option>
      </select>
      {pending && (
        <>
          <button
            type="submit"
            className="shrink-0 rounded-md bg-chalk px-2 py-1 text-sm font-semibold text-ink focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-chalk focus-visible:outline-solid"
          >
            Open
          </button>
          <span id="production-switcher-hint" className="sr-only" role="status">
            Press Enter to open {title(choice)}, Escape to stay.
          </span>
        </>
      )}
    </form>
  );
}
