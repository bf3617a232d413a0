import { Button } from "../button";

/**
 * Says what just happened and offers to take it back, where the change was made (role=status, so
 * screen readers hear it). The caller keeps what is needed to undo and clears it when dismissed.
 */
export function UndoBar({
  message,
  onUndo,
  onDismiss,
  busy,
}: {
  message: string;
  onUndo: () => void;
  onDismiss: () => void;
  busy?: boolean;
}) {
  return (
    <div
      role="status"
      className="flex flex-wrap items-center gap-2 rounded-md border border-ink-100 bg-ink-50 px-3 py-2 text-sm text-ink-900"
    >
      <span className="grow">{message}</span>
      <Button size="sm" variant="secondary" onClick={onUndo} busy={busy}>
        Undo
      </Button>
      <Button size="sm" variant="ghost" onClick={onDismiss} aria-label="Dismiss this notice">
        ×
      </Button>
    </div>
  );
}
