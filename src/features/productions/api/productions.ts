import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { CreateProductionInput, ProductionDto, UpdateProductionInput } from "@shared/schemas/productions";

export const productionsQueryOptions = () =>
  queryOptions({ queryKey: ["productions", "list"], queryFn: () => api.get<ProductionDto[]>("/productions") });
export const useProductions = () => useQuery(productionsQueryOptions());

export const productionQueryOptions = (id: string) =>
  queryOptions({ queryKey: ["productions", "detail", id], queryFn: () => api.get<ProductionDto>(`/productions/${id}`) });
export const useProduction = (id: string) => useQuery(productionQueryOptions(id));

export function useCreateProduction() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateProductionInput) => api.post<ProductionDto>("/productions", input),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: ["productions"] });
      void qc.invalidateQueries({ queryKey: ["me"] });
    },
  });
}

export function useUpdateProduction(id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateProductionInput) => api.patch<ProductionDto>(`/productions/${id}`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["productions"] }),
  });
}
