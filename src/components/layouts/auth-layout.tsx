import type { ReactNode } from "react";

/** Centered card for sign-in, reset and invitation pages. */
export function AuthLayout({ title, children }: { title: string; children: ReactNode }) {
  return (
    <main className="flex min-h-dvh items-center justify-center px-4 py-10">
      <div className="w-full max-w-sm">
        <p className="mb-6 text-center text-2xl font-bold tracking-wide text-ink">Seamscene</p>
        <div className="rounded-lg border border-chalk-200 bg-white p-6 shadow-sm">
          <h1 className="mb-4 text-lg font-semibold text-ink">{title}</h1>
          {children}
        </div>
      </div>
    </main>
  );
}
