import { useState } from "react";
import { NavLink, Outlet, useNavigate, useParams } from "react-router-dom";
import { screens, can, roleLabels } from "@shared/permissions";
import { useMe, useLogout } from "@/features/auth/api/auth";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { paths } from "@/config/paths";
import { cn } from "@/utils/cn";
import { Spinner, ErrorAlert } from "@/components/ui/feedback";
import { ConfirmDialog } from "@/components/ui/dialog";
import { QueueBadge } from "@/components/offline";
import { useOfflineQueue, useQueueRunner } from "@/lib/offline/hooks";
import { ProductionSwitcher } from "./production-switcher";

/** Header with production switcher and account, navigation built from the permission table. */
export function AppShell() {
  const me = useMe();
  const logout = useLogout();
  const navigate = useNavigate();
  const { screen } = useParams();
  const { productionId, production, role, query } = useCurrentProduction();
  const [menuOpen, setMenuOpen] = useState(false);
  const [confirmSignOut, setConfirmSignOut] = useState(false);
  useQueueRunner(me.data?.id);
  const queue = useOfflineQueue();
  // The mutation itself lands on the sign-in page with a full page load.
  const signOut = () => logout.mutate(me.data?.id);
  const allowed = screens.filter((s) => can(role, s.action));

  return (
    <div className="min-h-dvh">
      <a
        href="#main-content"
        className="sr-only rounded-md bg-chalk px-4 py-2 font-semibold text-ink shadow focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:z-50"
      >
        Skip to content
      </a>
      {/* One row of fixed height at every width: the phone menu opens right below it (top-14), never under it. */}
      <header className="sticky top-0 z-20 bg-ink text-chalk shadow">
        <div className="mx-auto flex h-14 max-w-7xl flex-nowrap items-center gap-2 px-2 sm:gap-3 sm:px-5">
          <button
            type="button"
            className="inline-flex size-11 shrink-0 items-center justify-center rounded md:hidden"
            aria-label="Menu"
            aria-expanded={menuOpen}
            aria-controls="main-nav"
            onClick={() => setMenuOpen((o) => !o)}
          >
            <span aria-hidden>☰</span>
          </button>
          <span className="shrink-0 font-bold tracking-wide">Seamscene</span>
          <ProductionSwitcher
            productionId={productionId}
            productions={me.data?.memberships ?? []}
            onOpen={(id) => navigate(paths.production.root.getHref(id))}
            onNew={() => navigate(paths.productions.new.getHref())}
          />
          <div className="ml-auto flex shrink-0 items-center gap-3 text-sm">
            <QueueBadge />
            <span className="hidden lg:inline">
              {me.data?.name}
              {role && <span className="ml-1 text-chalk/70">· {roleLabels[role]}</span>}
            </span>
            <button
              type="button"
              className="min-h-11 rounded px-2 underline-offset-2 hover:underline"
              onClick={() => (queue.items.length ? setConfirmSignOut(true) : signOut())}
            >
              Sign out
            </button>
          </div>
        </div>
      </header>
      <ConfirmDialog
        open={confirmSignOut}
        title="Sign out and delete what waits on this phone?"
        confirmLabel="Sign out and delete"
        danger
        busy={logout.isPending}
        onCancel={() => setConfirmSignOut(false)}
        onConfirm={() => {
          setConfirmSignOut(false);
          signOut();
        }}
      >
        <p>
          {queue.items.length} record{queue.items.length === 1 ? "" : "s"} captured on this phone{" "}
          {queue.items.length === 1 ? "has" : "have"} not been sent yet. Signing out deletes
          {queue.items.length === 1 ? " it" : " them"} and everything saved for offline for your account from this phone.
        </p>
      </ConfirmDialog>
      <div className="mx-auto flex max-w-7xl gap-5 px-3 py-4 sm:px-5">
        <nav
          id="main-nav"
          aria-label="Screens"
          className={cn(
            "shrink-0 md:block md:w-48",
            menuOpen
              ? "fixed inset-x-0 top-14 z-10 block max-h-[calc(100dvh-3.5rem)] overflow-y-auto bg-chalk p-3 shadow-lg md:static md:max-h-none md:p-0 md:shadow-none"
              : "hidden",
          )}
        >
          <ul className="grid gap-0.5">
            {allowed.map((s) => (
              <li key={s.key}>
                <NavLink
                  to={paths.production.screen.getHref(productionId, s.key)}
                  onClick={() => setMenuOpen(false)}
                  className={({ isActive }) =>
                    cn(
                      "flex min-h-11 items-center rounded-md px-3 text-sm font-semibold",
                      isActive || screen === s.key ? "bg-ink text-chalk" : "text-ink hover:bg-ink-50",
                    )
                  }
                >
                  {s.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <main id="main-content" tabIndex={-1} className="min-w-0 flex-1 outline-none">
          {query.isPending ? (
            <Spinner />
          ) : query.error ? (
            <ErrorAlert error={query.error} title="Cannot open this production" />
          ) : production ? (
            <Outlet />
          ) : null}
        </main>
      </div>
    </div>
  );
}
