import { Navigate, Route, Routes, useParams } from "react-router-dom";
import { screens, can, type ScreenKey } from "@shared/permissions";
import { useCurrentProduction } from "@/hooks/use-current-production";
import { screenComponents, screenSubpages } from "./screens";
import { Card } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page";

/** The first screen a role may open (vfx users land on Digital doubles). */
export function firstScreenFor(role: Parameters<typeof can>[0]): ScreenKey {
  return screens.find((s) => can(role, s.action))?.key ?? "today";
}

/** Renders the screen named in the URL, if the role may open it. */
export function ScreenRoute() {
  const { screen = "today" } = useParams();
  const { role, productionId } = useCurrentProduction();
  const def = screens.find((s) => s.key === screen);
  if (!role) return null;
  if (!def) return <Navigate to={`/p/${productionId}/${firstScreenFor(role)}`} replace />;
  if (!can(role, def.action)) {
    if (screen === "today") return <Navigate to={`/p/${productionId}/${firstScreenFor(role)}`} replace />;
    return (
      <Card>
        <PageHeader title={def.label} />
        <p className="text-sm text-slate">
          Your role in this production does not open this screen. Ask the costume supervisor if you need it.
        </p>
      </Card>
    );
  }
  const Component = screenComponents[def.key];
  const subpages = screenSubpages[def.key] ?? [];
  const notBuilt = (
    <Card>
      <PageHeader title={def.label} />
      <p className="text-sm text-slate">This screen is not built yet.</p>
    </Card>
  );
  if (!subpages.length) return Component ? <Component /> : notBuilt;
  // Sub-pages registered by other features match first (even before the screen itself is built);
  // their params reach useParams().
  return (
    <Routes>
      {subpages.map((p) => (
        <Route key={p.path} path={p.path} element={<p.component />} />
      ))}
      <Route path="*" element={Component ? <Component /> : notBuilt} />
    </Routes>
  );
}
