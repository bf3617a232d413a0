import { Navigate } from "react-router-dom";
import { useMe } from "@/features/auth/api/auth";
import { paths } from "@/config/paths";
import { firstScreenFor } from "./screen-route";

/** Opens the production used last, or the first one, or offers to create one. */
export default function HomeRedirect() {
  const me = useMe();
  const memberships = me.data?.memberships ?? [];
  if (!memberships.length) return <Navigate to={paths.productions.new.getHref()} replace />;
  const last = memberships.find((m) => m.productionId === me.data?.lastProductionId) ?? memberships[0]!;
  return <Navigate to={paths.production.screen.getHref(last.productionId, firstScreenFor(last.role))} replace />;
}
