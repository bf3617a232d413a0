import { useEffect, useRef, useState, type FormEvent } from "react";
import { dismissSnagInputSchema, snagDismissalLimits, type SnagDismissalDto } from "@shared/schemas/snags";
import { Button } from "@/components/ui/button";
import { TextareaField } from "@/components/ui/field";
import { ErrorAlert } from "@/components/ui/feedback";
import { ApiError } from "@/lib/api-client";
import { useDismissSnag } from "../api/snags";

interface DismissDialogProps {
  productionId: string;
  snag: { key: string; title: string } | null;
  onClose: () => void;
  /** Called with the saved dismissal (the list offers an inline Undo where the card was). */
  onDismissed?: (dismissal: SnagDismissalDto) => void;
}

/** Asks why a snag is accepted; the reason is required (3–500 characters) and shown to everyone. */
export function DismissDialog({ productionId, snag, onClose, onDismissed }: DismissDialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const [reason, setReason] = useState("");
  const [fieldError, setFieldError] = useState<string | undefined>();
  const dismiss = useDismissSnag(productionId);
  const open = snag !== null;

  // A new snag to dismiss starts with an empty form (adjusted while rendering, as React advises).
  const [formFor, setFormFor] = useState(snag);
  if (formFor !== snag) {
    setFormFor(snag);
    if (snag) {
      setReason("");
      setFieldError(undefined);
    }
  }
  const { reset } = dismiss;
  useEffect(() => {
    const d = ref.current;
    if (!d) return;
    if (open && !d.open) d.showModal?.();
    if (!open && d.open) d.close();
    if (open) reset();
  }, [open, reset]);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!snag) return;
    const parsed = dismissSnagInputSchema.safeParse({ snagKey: snag.key, reason });
    if (!parsed.success) {
      setFieldError(parsed.error.issues.find((i) => i.path[0] === "reason")?.message ?? parsed.error.issues[0]?.message);
      return;
    }
    setFieldError(undefined);
    dismiss.mutate(parsed.data, {
      onSuccess: (d) => {
        onDismissed?.(d);
        onClose();
      },
      onError: (err) => {
        if (err instanceof ApiError && err.fields.reason) setFieldError(err.fields.reason);
      },
    });
  };

  return (
    <dialog
      ref={ref}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className="m-auto w-[min(32rem,94vw)] rounded-lg border border-chalk-200 bg-white p-5 shadow-xl backdrop:bg-ink-900/40"
      aria-labelledby="dismiss-title"
    >
      <form onSubmit={submit} noValidate className="grid gap-3">
        <h2 id="dismiss-title" className="text-lg font-semibold text-ink">
          Dismiss this snag?
        </h2>
        {snag && <p className="text-sm text-slate">{snag.title}</p>}
        <TextareaField
          label="Reason"
          name="reason"
          value={reason}
          maxLength={snagDismissalLimits.reasonMax}
          onChange={(e) => setReason(e.target.value)}
          error={fieldError}
          hint="Everyone sees why. The snag comes back by itself if the numbers behind it change."
        />
        {dismiss.error && !(dismiss.error instanceof ApiError && dismiss.error.fields.reason) && (
          <ErrorAlert error={dismiss.error} title="Not dismissed" />
        )}
        <div className="flex flex-wrap justify-end gap-2">
          <Button variant="secondary" size="lg" onClick={onClose}>
            Cancel
          </Button>
          <Button type="submit" size="lg" busy={dismiss.isPending}>
            Dismiss snag
          </Button>
        </div>
      </form>
    </dialog>
  );
}
