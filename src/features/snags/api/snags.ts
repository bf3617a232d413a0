import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, qs } from "@/lib/api-client";
import type { DismissSnagInput, MultiplesPlanDto, SnagDismissalDto, SnagListDto } from "@shared/schemas/snags";
import type { SnagKind, SnagSeverity } from "@shared/domain/snags/types";

/** Filters the Snags screen sends to the server. */
export interface SnagListParams {
  severity?: SnagSeverity;
  kind?: SnagKind;
  characterId?: string;
  /** A shoot day id, or "next" for the next shoot day or performance from today. */
  shootDayId?: string;
  includeDismissed?: boolean;
}

const base = (pid: string) => `/productions/${pid}/snags`;

/** Query options for a production's snags with filters (key `["snags", pid, "list", params]`). */
export const snagsQueryOptions = (pid: string, params: SnagListParams = {}) =>
  queryOptions({
    queryKey: ["snags", pid, "list", params],
    queryFn: () => api.get<SnagListDto>(`${base(pid)}${qs({ ...params, includeDismissed: params.includeDismissed ? "true" : undefined })}`),
    placeholderData: keepPreviousData,
  });

/** The snags of a production (the server recomputes them on the first read after a change). */
export const useSnags = (pid: string, params: SnagListParams = {}) =>
  useQuery({ ...snagsQueryOptions(pid, params), enabled: Boolean(pid) });

/** Query options for one multiples group's copy plan. */
export const multiplesPlanQueryOptions = (pid: string, groupId: string) =>
  queryOptions({
    queryKey: ["snags", pid, "multiples", groupId],
    queryFn: () => api.get<MultiplesPlanDto>(`${base(pid)}/multiples/${groupId}`),
  });

/** Which copy of a multiples group goes into which scene. */
export const useMultiplesPlan = (pid: string, groupId: string) =>
  useQuery({ ...multiplesPlanQueryOptions(pid, groupId), enabled: Boolean(pid && groupId) });

/** Dismiss a snag with a reason; every snag list of the production refreshes. */
export function useDismissSnag(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: DismissSnagInput) => api.post<SnagDismissalDto>(`${base(pid)}/dismissals`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["snags", pid] }),
  });
}

/** Undo a dismissal (the snag shows again). */
export function useUndoDismissal(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (dismissalId: string) => api.delete(`${base(pid)}/dismissals/${dismissalId}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["snags", pid] }),
  });
}
