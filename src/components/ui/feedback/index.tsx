import type { ReactNode } from "react";
import { cn } from "@/utils/cn";
import { ApiError } from "@/lib/api-client";

/** Loading indicator with a text for screen readers. */
export function Spinner({ label = "Loading…", className }: { label?: string; className?: string }) {
  return (
    <div role="status" className={cn("flex items-center gap-2 text-sm text-slate", className)}>
      <span className="size-4 animate-spin rounded-full border-2 border-ink border-t-transparent" aria-hidden />
      {label}
    </div>
  );
}

/** Shows what went wrong, with the server's message when there is one. */
export function ErrorAlert({ error, title = "That did not work" }: { error: unknown; title?: string }) {
  const message = error instanceof ApiError ? error.message : error instanceof Error ? error.message : String(error);
  return (
    <div role="alert" className="rounded-md border border-madder/40 bg-madder-50 px-3 py-2 text-sm text-madder">
      <strong className="font-semibold">{title}: </strong>
      {message}
    </div>
  );
}

/** For lists with nothing in them yet: say so, and say what to do. */
export function EmptyState({ title, children, action }: { title: string; children?: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-ink-100 bg-white/60 px-6 py-10 text-center">
      <p className="font-semibold text-ink">{title}</p>
      {children && <div className="mt-1 text-sm text-slate">{children}</div>}
      {action && <div className="mt-4">{action}</div>}
    </div>
  );
}

const severityStyles = {
  blocking: "bg-madder-50 text-madder border-madder/40",
  warning: "bg-ochre-50 text-[#8a5d17] border-ochre/50",
  note: "bg-slate-50 text-slate border-slate/30",
  neutral: "bg-ink-50 text-ink border-ink-100",
} as const;

/** A small label; severities use our madder / ochre / slate. */
export function Badge({ tone = "neutral", children }: { tone?: keyof typeof severityStyles; children: ReactNode }) {
  return (
    <span className={cn("inline-flex items-center rounded border px-1.5 py-0.5 text-xs font-semibold", severityStyles[tone])}>
      {children}
    </span>
  );
}

/** A caution box for work that can hurt someone (chemicals, blades, heat, stunts, water, fire). */
export function SafetyNote({ children }: { children: ReactNode }) {
  return (
    <div role="note" className="rounded-md border-l-4 border-ochre bg-ochre-50 px-3 py-2 text-sm text-ink-900">
      <strong className="font-semibold">Safety: </strong>
      {children} Follow local codes, the production's safety officer and licensed practice.
    </div>
  );
}
