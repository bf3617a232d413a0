// The offline parts of the screens: the header badge with the queue list (see and cancel each
// record), and the "saved for offline at" stamp with its Save button.
import { useEffect, useRef, useState } from "react";
import { formatTime, formatWallTime } from "@shared/format";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { removeQueued, retryQueued } from "@/lib/offline/queue";
import { queueRunner } from "@/lib/offline/runner";
import { saveOfflinePack } from "@/lib/offline/pack";
import { useOfflineQueue, useSavedPack } from "@/lib/offline/hooks";
import type { QueuedItem } from "@/lib/offline/db";
import { cn } from "@/utils/cn";

/** The header badge: how many records wait on this phone; opens the list. */
export function QueueBadge() {
  const q = useOfflineQueue();
  const [open, setOpen] = useState(false);
  const panel = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    panel.current?.focus();
    // Escape closes the list wherever focus is, as it closes every pop-up in the app.
    const onKey = (e: KeyboardEvent) => e.key === "Escape" && setOpen(false);
    document.addEventListener("keydown", onKey);
    return () => document.removeEventListener("keydown", onKey);
  }, [open]);
  const held = q.items.filter((i) => i.state === "held").length;
  if (!q.userId || (q.items.length === 0 && q.online)) return null;
  return (
    <div className="relative">
      <button
        type="button"
        aria-expanded={open}
        aria-controls="offline-queue"
        onClick={() => setOpen((o) => !o)}
        className={cn("rounded px-2 py-1 text-sm font-semibold", held ? "bg-madder text-white" : "bg-chalk text-ink")}
      >
        {!q.online && <span>No signal · </span>}
        <span data-testid="queue-count">{q.items.length}</span> waiting
      </button>
      {open && (
        <div
          id="offline-queue"
          ref={panel}
          tabIndex={-1}
          role="region"
          aria-label="Waiting to be sent"
          className="fixed inset-x-2 top-24 z-30 grid sm:absolute sm:inset-x-auto sm:top-auto sm:right-0 sm:mt-2 sm:w-[24rem] gap-2 rounded-lg bg-white p-3 text-ink shadow-xl outline-none"
        >
          <QueueList />
        </div>
      )}
    </div>
  );
}

/** Every record waiting on this phone, oldest first, each with Cancel (and Try again when held). */
export function QueueList() {
  const q = useOfflineQueue();
  const [cancel, setCancel] = useState<QueuedItem | null>(null);
  return (
    <div className="grid gap-2">
      <p className="text-sm" role="status">
        {q.items.length === 0
          ? "Nothing waiting: everything captured on this phone has been sent."
          : !q.online
            ? "No signal. These are kept on this phone and sent, oldest first, when the signal is back."
            : q.signInNeeded
              ? "Sign in again to send these."
              : "Sending, oldest first."}
      </p>
      {q.items.length > 0 && (
        <ol className="grid max-h-80 gap-1 overflow-y-auto" aria-label="Queue">
          {q.items.map((i) => (
            <li key={i.clientId} className="grid gap-1 rounded border border-ink-100 p-2 text-sm">
              <span className="font-semibold">{i.summary}</span>
              <span className="text-slate">
                {i.kind === "continuity" ? "Continuity" : "Check in / out"} · captured {formatWallTime(new Date(i.queuedAt))}
                {q.sendingClientId === i.clientId
                  ? " · sending…"
                  : i.state === "held"
                    ? " · not accepted"
                    : i.attempts
                      ? ` · tried ${i.attempts}×`
                      : ""}
              </span>
              {i.lastError && <span className={i.state === "held" ? "text-madder" : "text-slate"}>{i.lastError}</span>}
              <span className="flex gap-2">
                {i.state === "held" && (
                  <Button size="sm" variant="secondary" onClick={() => void retryQueued(i.clientId).then(() => queueRunner.kick(true))}>
                    Try again
                  </Button>
                )}
                <Button
                  size="sm"
                  variant="ghost"
                  aria-label={`Cancel: ${i.summary}`}
                  onClick={() => setCancel(i)}
                  disabled={q.sendingClientId === i.clientId}
                >
                  Cancel
                </Button>
              </span>
            </li>
          ))}
        </ol>
      )}
      {q.items.length > 0 && q.online && (
        <Button size="sm" variant="secondary" onClick={() => queueRunner.kick(true)}>
          Send now
        </Button>
      )}
      <ConfirmDialog
        open={cancel !== null}
        title="Cancel this record?"
        confirmLabel="Cancel it"
        danger
        onCancel={() => setCancel(null)}
        onConfirm={() => {
          if (cancel) void removeQueued(cancel.clientId);
          setCancel(null);
        }}
      >
        <p>{cancel?.summary}</p>
        <p className="mt-1">
          It is deleted from this phone and never sent
          {cancel?.photos.length ? `, with its ${cancel.photos.length} photo${cancel.photos.length > 1 ? "s" : ""}` : ""}.
        </p>
      </ConfirmDialog>
    </div>
  );
}

/**
 * "Saved for offline at 07:12" and a Save button. Saves by itself once per opening when there is a
 * signal, so the next two shoot days are on the phone before the crew moves to a location.
 */
export function OfflineStamp({ userId, productionId, timeZone }: { userId: string; productionId: string; timeZone: string }) {
  const pack = useSavedPack(userId, productionId);
  const q = useOfflineQueue();
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const save = () => {
    setBusy(true);
    setError(null);
    saveOfflinePack(userId, productionId)
      .catch((e: unknown) => setError(e instanceof Error ? e.message : String(e)))
      .finally(() => setBusy(false));
  };
  const auto = useRef(false);
  useEffect(() => {
    if (auto.current || !q.online) return;
    auto.current = true;
    save();
    // eslint-disable-next-line react-hooks/exhaustive-deps
  }, [q.online]);
  return (
    <div className="flex flex-wrap items-center gap-2 text-sm" role="status" aria-live="polite">
      <span data-testid="offline-stamp">
        {pack
          ? `Saved for offline at ${formatTime(pack.savedAt, timeZone)} · ${pack.shootDays.length} shoot day${pack.shootDays.length === 1 ? "" : "s"}`
          : busy
            ? "Saving for offline…"
            : "Not saved for offline on this phone"}
      </span>
      {q.online && (
        <Button size="sm" variant="secondary" onClick={save} busy={busy}>
          Save for offline
        </Button>
      )}
      {error && <span className="text-madder">Not saved for offline: {error}</span>}
    </div>
  );
}
