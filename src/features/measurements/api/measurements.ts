import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { CreateMeasurementSetInput, MeasurementSetDto, PerformerMeasurementsDto } from "@shared/schemas/measurements";

const base = (pid: string, performerId: string) => `/productions/${pid}/performers/${performerId}/measurements`;

export const performerMeasurementsQueryOptions = (pid: string, performerId: string) =>
  queryOptions({ queryKey: ["measurements", pid, performerId], queryFn: () => api.get<PerformerMeasurementsDto>(base(pid, performerId)) });
export const usePerformerMeasurements = (pid: string, performerId: string) => useQuery(performerMeasurementsQueryOptions(pid, performerId));

export function useCreateMeasurementSet(pid: string, performerId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateMeasurementSetInput) => api.post<MeasurementSetDto>(base(pid, performerId), input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["measurements", pid, performerId] }),
  });
}

export function useDeleteMeasurementSet(pid: string, performerId: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (setId: string) => api.delete(`${base(pid, performerId)}/${setId}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["measurements", pid, performerId] }),
  });
}
