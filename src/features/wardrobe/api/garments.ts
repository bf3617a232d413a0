import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, qs } from "@/lib/api-client";
import type { Pagination } from "@shared/schemas/common";
import type {
  AddCopiesInput,
  CheckoutInput,
  CheckoutOptionsDto,
  CreateGarmentInput,
  GarmentDetailDto,
  GarmentDto,
  GarmentMoveResultDto,
  GarmentStatus,
  MoveGarmentsInput,
  OpenCheckoutDto,
  UpdateGarmentInput,
} from "@shared/schemas/garments";
import type { FabricDto } from "@shared/schemas/fabrics";

const base = (pid: string) => `/productions/${pid}/garments`;

/** List parameters as they sit in the URL. */
export interface GarmentListParams {
  page: number;
  pageSize: number;
  q?: string;
  category?: string;
  status?: string;
  characterId?: string;
  rack?: string;
  source?: string;
  dueWithinDays?: string;
  /** "out" (with someone) or "past_due". */
  out?: string;
  sort?: string;
  dir?: "asc" | "desc";
}

/** Query string for the list, CSV and label endpoints (same filters). */
export function garmentQueryString(p: Partial<GarmentListParams> & { ids?: string }): string {
  return qs({ ...p });
}

export const garmentsQueryOptions = (pid: string, p: GarmentListParams) =>
  queryOptions({
    queryKey: ["garments", pid, "list", p],
    queryFn: () => api.getRaw<{ data: GarmentDto[]; pagination: Pagination }>(`${base(pid)}${garmentQueryString(p)}`),
    placeholderData: keepPreviousData,
  });
export const useGarments = (pid: string, p: GarmentListParams) => useQuery(garmentsQueryOptions(pid, p));

export const garmentQueryOptions = (pid: string, id: string) =>
  queryOptions({ queryKey: ["garments", pid, "detail", id], queryFn: () => api.get<GarmentDetailDto>(`${base(pid)}/${id}`) });
export const useGarment = (pid: string, id: string) => useQuery(garmentQueryOptions(pid, id));

export const useGarmentFilterOptions = (pid: string) =>
  useQuery({
    queryKey: ["garments", pid, "filter-options"],
    queryFn: () =>
      api.get<{ categories: string[]; racks: string[]; characters: Array<{ id: string; name: string }> }>(`${base(pid)}/filter-options`),
    staleTime: 60_000,
  });

/** Members, performers and the days from today on, for the check-out fields. */
export const useCheckoutOptions = (pid: string, enabled = true) =>
  useQuery({
    queryKey: ["garments", pid, "checkout-options"],
    queryFn: () => api.get<CheckoutOptionsDto>(`${base(pid)}/checkout-options`),
    staleTime: 60_000,
    enabled,
  });

/** Who has what now (open check-outs, soonest due first). */
export const useOpenCheckouts = (pid: string) =>
  useQuery({ queryKey: ["garments", pid, "checkouts"], queryFn: () => api.get<OpenCheckoutDto[]>(`${base(pid)}/checkouts`) });

/** Fabric names for the garment form's select (only roles that may read fabrics ask). */
export const useFabricOptions = (pid: string, enabled: boolean) =>
  useQuery({ queryKey: ["fabrics", pid, "list"], queryFn: () => api.get<FabricDto[]>(`/productions/${pid}/fabrics`), enabled });

export function useCreateGarment(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: Partial<CreateGarmentInput>) => api.post<GarmentDto[]>(base(pid), input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["garments", pid] }),
  });
}

export function useUpdateGarment(pid: string, id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UpdateGarmentInput) => api.patch<GarmentDto>(`${base(pid)}/${id}`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["garments", pid] }),
  });
}

export function useAddCopies(pid: string, id: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: AddCopiesInput) => api.post<GarmentDto[]>(`${base(pid)}/${id}/copies`, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["garments", pid] }),
  });
}

export function useMoveGarments(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: MoveGarmentsInput) => api.post<GarmentMoveResultDto[]>(`${base(pid)}/moves`, input),
    // A move can close or open a check-out, which the snags judge.
    onSuccess: () =>
      Promise.all([qc.invalidateQueries({ queryKey: ["garments", pid] }), qc.invalidateQueries({ queryKey: ["snags", pid] })]),
  });
}

/** Check in / out by tag code. */
export function useScanGarment(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: {
      tagCode: string;
      status: GarmentStatus;
      locationRack?: string | null;
      locationBin?: string | null;
      note?: string | null;
      checkout?: CheckoutInput | null;
    }) => api.post<GarmentMoveResultDto>(`${base(pid)}/scan`, input),
    onSuccess: () =>
      Promise.all([qc.invalidateQueries({ queryKey: ["garments", pid] }), qc.invalidateQueries({ queryKey: ["snags", pid] })]),
  });
}

const garmentParamsForFiles = (p: Partial<GarmentListParams> & { ids?: string }) => ({
  ...p,
  page: undefined,
  pageSize: undefined,
  sort: undefined,
  dir: undefined,
});

/** URLs of the file endpoints (opened in a new tab / downloaded by the browser). */
export const garmentFileUrls = {
  csv: (pid: string, p: Partial<GarmentListParams> & { ids?: string }) =>
    `/api${base(pid)}/export.csv${garmentQueryString({ ...p, page: undefined, pageSize: undefined, sort: undefined, dir: undefined })}`,
  /** @param start first free position on a partly used sheet (1 = top left) */
  labels: (pid: string, p: Partial<GarmentListParams> & { ids?: string }, start = 1) =>
    `/api${base(pid)}/labels.pdf${qs({ ...garmentParamsForFiles(p), start: start > 1 ? start : undefined })}`,
};
