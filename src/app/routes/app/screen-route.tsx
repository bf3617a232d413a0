import { Navigate, matchPath, useParams } from "react-router";
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
  const { screen = "today", "*": rest = "" } = useParams();
  const { role, productionId } = useCurrentProduction();
  const def = screens.find((s) => s.key === screen);
  if (!role) return null;
  if (!def) return <Navigate to={`/p/${productionId}/${firstScreenFor(role)}`} replace />;
  if (!can(role, def.action)) {
    if (screen === "today") return <Navigate to={`/p/${productionId}/${firstScreenFor(role)}`} replace />;
    return (
      <Card>
        <PageHeader title={def.label} />
        <p className="text-sm text-slate">Your role in this production does not open this screen. Ask the costume supervisor if you need it.</p>
      </Card>
    );
  }
  const sub = screenSubpages[def.key]?.find((p) => matchPath({ path: p.path, end: true }, rest));
  if (sub) {
    const Sub = sub.component;
    return <Sub />;
  }
  const Component = screenComponents[def.key];
  if (!Component) {
    return (
      <Card>
        <PageHeader title={def.label} />
        <p className="text-sm text-slate">This screen is not built yet.</p>
      </Card>
    );
  }
  return <Component />;
}
