import { useQuery } from "@tanstack/react-query";
import { useParams } from "react-router-dom";
import { api } from "@/lib/api-client";
import { can, type Action } from "@shared/permissions";
import type { ProductionDto } from "@shared/schemas/productions";

/**
 * The production in the URL with the user's role, a `can(action)` check for hiding actions, and `today`
 * in the production's time zone from the server's clock (the browser's clock never decides "today").
 */
export function useCurrentProduction() {
  const { productionId = "" } = useParams();
  const query = useQuery({
    queryKey: ["productions", "detail", productionId],
    queryFn: () => api.get<ProductionDto>(`/productions/${productionId}`),
    enabled: Boolean(productionId),
  });
  const role = query.data?.role;
  return { productionId, production: query.data, query, role, today: query.data?.today ?? "", can: (action: Action) => can(role, action) };
}
