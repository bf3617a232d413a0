import { useState } from "react";
import { NavLink, Outlet, useNavigate, useParams } from "react-router";
import { screens, can, roleLabels } from "@shared/permissions";
import { useMe, useLogout } from "@/features/auth/api/auth";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { paths } from "@/config/paths";
import { cn } from "@/utils/cn";
import { Spinner, ErrorAlert } from "@/components/ui/feedback";
import { ProductionSwitcher } from "./production-switcher";

/** Header with production switcher and account, navigation built from the permission table. */
export function AppShell() {
  const me = useMe();
  const logout = useLogout();
  const navigate = useNavigate();
  const { screen } = useParams();
  const { productionId, production, role, query } = useCurrentProduction();
  const [menuOpen, setMenuOpen] = useState(false);
  const allowed = screens.filter((s) => can(role, s.action));

  return (
    <div className="min-h-dvh">
      <a href="#main-content" className="sr-only rounded-md bg-chalk px-4 py-2 font-semibold text-ink shadow focus:not-sr-only focus:fixed focus:top-2 focus:left-2 focus:z-50">
        Skip to content
      </a>
      <header className="sticky top-0 z-20 bg-ink text-chalk shadow">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center gap-3 px-3 py-2 sm:px-5">
          <button
            type="button"
            className="rounded p-2 md:hidden"
            aria-label="Menu"
            aria-expanded={menuOpen}
            aria-controls="main-nav"
            onClick={() => setMenuOpen((o) => !o)}
          >
            <span aria-hidden>☰</span>
          </button>
          <span className="font-bold tracking-wide">Seamscene</span>
          <ProductionSwitcher
            productionId={productionId}
            productions={me.data?.memberships ?? []}
            onOpen={(id) => navigate(paths.production.root.getHref(id))}
            onNew={() => navigate(paths.productions.new.getHref())}
          />
          <div className="ml-auto flex items-center gap-3 text-sm">
            <span className="hidden sm:inline">
              {me.data?.name}
              {role && <span className="ml-1 text-chalk/70">· {roleLabels[role]}</span>}
            </span>
            <button type="button" className="rounded px-2 py-1 underline-offset-2 hover:underline" onClick={() => logout.mutate(undefined, { onSettled: () => navigate(paths.auth.login.getHref()) })}>
              Sign out
            </button>
          </div>
        </div>
      </header>
      <div className="mx-auto flex max-w-7xl gap-5 px-3 py-4 sm:px-5">
        <nav id="main-nav" aria-label="Screens" className={cn("w-48 shrink-0 md:block", menuOpen ? "fixed inset-x-0 top-14 z-10 block bg-chalk p-3 shadow-lg md:static md:p-0 md:shadow-none" : "hidden")}>
          <ul className="grid gap-0.5">
            {allowed.map((s) => (
              <li key={s.key}>
                <NavLink
                  to={paths.production.screen.getHref(productionId, s.key)}
                  onClick={() => setMenuOpen(false)}
                  className={({ isActive }) => cn("block rounded-md px-3 py-2.5 text-sm font-semibold md:py-2", isActive || screen === s.key ? "bg-ink text-chalk" : "text-ink hover:bg-ink-50")}
                >
                  {s.label}
                </NavLink>
              </li>
            ))}
          </ul>
        </nav>
        <main id="main-content" tabIndex={-1} className="min-w-0 flex-1 outline-none">
          {query.isPending ? <Spinner /> : query.error ? <ErrorAlert error={query.error} title="Cannot open this production" /> : production ? <Outlet /> : null}
        </main>
      </div>
    </div>
  );
}
