import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, qs } from "@/lib/api-client";
import type { GarmentDto, WrapDisposition } from "@shared/schemas/garments";
import type {
  BookPhotoSize,
  BudgetDto,
  ContinuityBooksIndexDto,
  RackListDto,
  ReportRunDto,
  ReturnsDto,
  ReturnsSection,
} from "@shared/schemas/reports";

const base = (pid: string) => `/productions/${pid}/reports`;

/** Addresses of the files the reports download (opened by the browser, not fetched as JSON). */
export const reportFileUrls = {
  continuityBook: (pid: string, characterId: string, opts: { changeId?: string; photos?: BookPhotoSize } = {}) =>
    `/api${base(pid)}/continuity/${characterId}.pdf${qs({ changeId: opts.changeId, photos: opts.photos === "thumb" ? undefined : opts.photos })}`,
  rackListPdf: (pid: string, shootDayId?: string) => `/api${base(pid)}/rack-list.pdf${qs({ shootDayId })}`,
  returnsCsv: (pid: string, section: ReturnsSection) => `/api${base(pid)}/returns.csv${qs({ section })}`,
  returnsXlsx: (pid: string) => `/api${base(pid)}/returns.xlsx`,
  budgetCsv: (pid: string, by: string) => `/api${base(pid)}/budget.csv${qs({ by })}`,
  budgetXlsx: (pid: string) => `/api${base(pid)}/budget.xlsx`,
};

/** Characters and their changes for the continuity books, with the newest "all books" export. */
export const continuityBooksQueryOptions = (pid: string) =>
  queryOptions({ queryKey: ["reports", pid, "continuity"], queryFn: () => api.get<ContinuityBooksIndexDto>(`${base(pid)}/continuity`) });
export const useContinuityBooks = (pid: string) => useQuery({ ...continuityBooksQueryOptions(pid), enabled: Boolean(pid) });

/** Starts the export of every book in one ZIP (or returns the one already running). */
export function useStartBooksRun(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (photos: BookPhotoSize) => api.post<ReportRunDto>(`${base(pid)}/continuity/books`, { photos }),
    onSuccess: (run) => {
      qc.setQueryData(["reports", pid, "runs", run.id], run);
      void qc.invalidateQueries({ queryKey: ["reports", pid, "continuity"] });
    },
  });
}

/** An export's progress, polled every second while it runs. */
export function useReportRun(pid: string, runId: string | null) {
  return useQuery({
    queryKey: ["reports", pid, "runs", runId],
    queryFn: () => api.get<ReportRunDto>(`${base(pid)}/runs/${runId}`),
    enabled: Boolean(pid && runId),
    refetchInterval: (q) => (q.state.data && (q.state.data.status === "queued" || q.state.data.status === "running") ? 1000 : false),
  });
}

/** Tomorrow's rack list (or the named day's). */
export const rackListQueryOptions = (pid: string, shootDayId?: string) =>
  queryOptions({
    queryKey: ["reports", pid, "rack", shootDayId ?? "next"],
    queryFn: () => api.get<RackListDto>(`${base(pid)}/rack-list${qs({ shootDayId })}`),
  });
export const useRackList = (pid: string, shootDayId?: string) =>
  useQuery({ ...rackListQueryOptions(pid, shootDayId), enabled: Boolean(pid) });

export const useReturns = (pid: string) =>
  useQuery({ queryKey: ["reports", pid, "returns"], queryFn: () => api.get<ReturnsDto>(`${base(pid)}/returns`), enabled: Boolean(pid) });
export const useBudget = (pid: string) =>
  useQuery({ queryKey: ["reports", pid, "budget"], queryFn: () => api.get<BudgetDto>(`${base(pid)}/budget`), enabled: Boolean(pid) });

/** Keep or sell an owned garment at wrap (null = not decided); returns and budget refresh. */
export function useSetWrapDisposition(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: ({ garmentId, wrapDisposition }: { garmentId: string; wrapDisposition: WrapDisposition | null }) =>
      api.patch<GarmentDto>(`/productions/${pid}/garments/${garmentId}`, { wrapDisposition }),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: ["reports", pid] });
      void qc.invalidateQueries({ queryKey: ["garments", pid] });
    },
  });
}
