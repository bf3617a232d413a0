import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, qs } from "@/lib/api-client";
import type {
  AlterationTicketDto,
  CapacityDto,
  CreateFittingInput,
  CreateTicketInput,
  EmailJobDto,
  FittingDetailDto,
  FittingDto,
  LinkFittingItemInput,
  TicketStatus,
  UpdateFittingInput,
  UpdateTicketInput,
  UpsertCapacityInput,
  WorkroomOptionsDto,
  WorkroomPlanDto,
  WorkroomSettingsInput,
} from "@shared/schemas/workroom";
import type { GarmentDto } from "@shared/schemas/garments";

const base = (pid: string) => `/productions/${pid}`;
// Every workroom query key starts with ["workroom", pid] so one invalidation re-plans everything.
const key = (pid: string, ...rest: unknown[]) => ["workroom", pid, ...rest];

export const planQueryOptions = (pid: string, from?: string) =>
  queryOptions({
    queryKey: key(pid, "plan", from ?? "today"),
    queryFn: () => api.get<WorkroomPlanDto>(`${base(pid)}/workroom/plan${qs({ from })}`),
  });
export const useWorkroomPlan = (pid: string, from?: string) => useQuery(planQueryOptions(pid, from));

export const useFittings = (pid: string) =>
  useQuery({ queryKey: key(pid, "fittings"), queryFn: () => api.get<FittingDto[]>(`${base(pid)}/fittings`) });
export const useFitting = (pid: string, id: string) =>
  useQuery({ queryKey: key(pid, "fitting", id), queryFn: () => api.get<FittingDetailDto>(`${base(pid)}/fittings/${id}`) });
export const useWorkroomOptions = (pid: string) =>
  useQuery({
    queryKey: key(pid, "options"),
    queryFn: () => api.get<WorkroomOptionsDto>(`${base(pid)}/workroom/options`),
    staleTime: 60_000,
  });
export const useCapacity = (pid: string) =>
  useQuery({ queryKey: key(pid, "capacity"), queryFn: () => api.get<CapacityDto[]>(`${base(pid)}/workroom/capacity`) });
export const useEmailJobs = (pid: string, enabled: boolean) =>
  useQuery({ queryKey: key(pid, "email-jobs"), queryFn: () => api.get<EmailJobDto[]>(`${base(pid)}/workroom/email-jobs`), enabled });

function useWorkroomMutation<TVars, TResult>(pid: string, fn: (vars: TVars) => Promise<TResult>) {
  const qc = useQueryClient();
  return useMutation({ mutationFn: fn, onSuccess: () => qc.invalidateQueries({ queryKey: ["workroom", pid] }) });
}

export const useCreateFitting = (pid: string) =>
  useWorkroomMutation(pid, (input: CreateFittingInput) => api.post<FittingDto>(`${base(pid)}/fittings`, input));
export const useUpdateFitting = (pid: string) =>
  useWorkroomMutation(pid, ({ id, ...input }: UpdateFittingInput & { id: string }) =>
    api.patch<FittingDto>(`${base(pid)}/fittings/${id}`, input),
  );
export const useRaiseTicket = (pid: string) =>
  useWorkroomMutation(pid, (input: CreateTicketInput) => api.post<AlterationTicketDto>(`${base(pid)}/alterations`, input));
export const useUpdateTicket = (pid: string) =>
  useWorkroomMutation(pid, ({ id, ...input }: UpdateTicketInput & { id: string }) =>
    api.patch<AlterationTicketDto>(`${base(pid)}/alterations/${id}`, input),
  );
export const useSetTicketStatus = (pid: string) =>
  useWorkroomMutation(pid, ({ id, status }: { id: string; status: TicketStatus }) =>
    api.post<AlterationTicketDto>(`${base(pid)}/alterations/${id}/status`, { status }),
  );
export const useUpsertCapacity = (pid: string) =>
  useWorkroomMutation(pid, ({ userId, ...input }: UpsertCapacityInput & { userId: string }) =>
    api.put<CapacityDto>(`${base(pid)}/workroom/capacity/${userId}`, input),
  );
export const useUpdateWorkroomSettings = (pid: string) =>
  useWorkroomMutation(pid, (input: WorkroomSettingsInput) => api.patch(`${base(pid)}/workroom/settings`, input));
export const useRetryEmailJob = (pid: string) =>
  useWorkroomMutation(pid, (id: string) => api.post<EmailJobDto>(`${base(pid)}/workroom/email-jobs/${id}/retry`));

/** Garments in stock matching a tag code or name (for linking an item at a fitting). */
export const useGarmentSearch = (pid: string, q: string) =>
  useQuery({
    queryKey: key(pid, "garment-search", q),
    queryFn: () => api.get<GarmentDto[]>(`${base(pid)}/garments${qs({ q, pageSize: 8 })}`),
    enabled: q.trim().length >= 2,
  });

/** Links a change item at a fitting to a garment from stock or a new one; the fitting and plan refresh. */
export const useLinkFittingItem = (pid: string) =>
  useWorkroomMutation(pid, ({ fittingId, changeItemId, ...input }: LinkFittingItemInput & { fittingId: string; changeItemId: string }) =>
    api.post<FittingDetailDto>(`${base(pid)}/fittings/${fittingId}/items/${changeItemId}/garment`, input),
  );
