import { useEffect, useId, useRef, type ReactNode } from "react";
import { Button } from "../button";

interface ConfirmDialogProps {
  open: boolean;
  title: string;
  children?: ReactNode;
  confirmLabel: string;
  danger?: boolean;
  busy?: boolean;
  onConfirm: () => void;
  onCancel: () => void;
}

/*
 * Every action that destroys work or tells someone outside the app asks first (this dialog) or
 * offers an undo (UndoBar in ../undo). Keep this list current when adding such an action:
 *
 * asks first (ConfirmDialog)
 * - Breakdown › Shoot days: delete a shoot day / performance (its scene order; continuity keeps the scene)
 * - Breakdown › scene page: delete a scene (appearances, continuity entries and their photos go too)
 * - Breakdown › scene page: remove a character from a scene (its change, distress stage and flags)
 * - Breakdown › Import: the preview lists every field's old → new value; "Import" is the confirmation
 * - Changes: remove an item from a change
 * - Workroom › fitting: cancel a fitting (e-mails the performer a cancellation)
 * - Workroom › calendar: drag a fitting to a new time (e-mails the performer an update)
 * - Workroom › e-mail failures: send an invitation or reminder again (e-mails the recipient)
 * - Team: remove a member; withdraw a pending invitation (the link stops working)
 * - Cast › measurements: delete a measurement set
 * - Photos (every owner): delete a photo
 * - Digital doubles: delete a panel; delete a seam; delete a packet draft; publish a packet (e-mails vfx)
 * - Fabrics: delete a fabric test
 * offers an undo (UndoBar)
 * - Breakdown › Shoot days: take a scene off a day; move a scene to another day
 * forms whose submit names the recipient (the form is the question)
 * - Workroom: book a fitting (the invitation's address is shown above "Book fitting")
 * - Team: invite a member (the address is the form's only field)
 */

/** A modal that asks before something is lost. Esc cancels; focus starts on Cancel. */
export function ConfirmDialog({ open, title, children, confirmLabel, danger, busy, onConfirm, onCancel }: ConfirmDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal?.();
    if (!open && d.open) d.close();
  }, [open]);
  return (
    <dialog
      ref={ref}
      onCancel={(e) => {
        e.preventDefault();
        onCancel();
      }}
      className="m-auto w-[min(28rem,92vw)] rounded-lg border border-chalk-200 bg-white p-5 shadow-xl backdrop:bg-ink-900/40"
      aria-labelledby={titleId}
    >
      <h2 id={titleId} className="text-lg font-semibold text-ink">
        {title}
      </h2>
      {children && <div className="mt-2 text-sm text-slate">{children}</div>}
      <div className="mt-5 flex justify-end gap-2">
        <Button variant="secondary" onClick={onCancel} autoFocus>
          Cancel
        </Button>
        <Button variant={danger ? "danger" : "primary"} onClick={onConfirm} busy={busy}>
          {confirmLabel}
        </Button>
      </div>
    </dialog>
  );
}
