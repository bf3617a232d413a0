import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type {
  CreateFabricInput,
  CreateFabricTestRequest,
  FabricDetailDto,
  FabricDto,
  FabricTestDto,
  UpdateFabricInput,
} from "@shared/schemas/fabrics";

const base = (pid: string) => `/productions/${pid}/fabrics`;

export const fabricsQueryOptions = (pid: string) =>
  queryOptions({ queryKey: ["fabrics", pid, "list"], queryFn: () => api.get<FabricDto[]>(base(pid)) });
export const useFabrics = (pid: string) => useQuery(fabricsQueryOptions(pid));

export const fabricQueryOptions = (pid: string, id: string) =>
  queryOptions({ queryKey: ["fabrics", pid, "detail", id], queryFn: () => api.get<FabricDetailDto>(`${base(pid)}/${id}`) });
export const useFabric = (pid: string, id: string) => useQuery(fabricQueryOptions(pid, id));

export function useCreateFabric(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateFabricInput) => api.post<FabricDto>(base(pid), input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["fabrics", pid] }),
  });
}

export function useUpdateFabric(pid: string, id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateFabricInput) => api.patch<FabricDto>(`${base(pid)}/${id}`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["fabrics", pid] }),
  });
}

export function useAddFabricTest(pid: string, id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateFabricTestRequest) => api.post<FabricTestDto>(`${base(pid)}/${id}/tests`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["fabrics", pid] }),
  });
}

export function useDeleteFabricTest(pid: string, id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (testId: string) => api.delete(`${base(pid)}/${id}/tests/${testId}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["fabrics", pid] }),
  });
}
