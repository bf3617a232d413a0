import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, qs } from "@/lib/api-client";
import type {
  CreatePanelInput,
  CreateSeamInput,
  DoublesChangeDto,
  DoublesFabricOptionDto,
  FabricPhysicsDto,
  MarkerDto,
  MarkerInput,
  PanelDto,
  SeamDto,
  UpdatePanelInput,
} from "@shared/schemas/doubles";
import type { DxfImport } from "@shared/domain/panels/dxf";
import type { DxfUnit } from "@shared/domain/panels/dxf-units";

const base = (pid: string) => `/productions/${pid}`;

/** A garment or a whole change. */
export interface DoublesScope {
  garmentId?: string;
  changeId?: string;
}

export const doublesChangesQueryOptions = (pid: string) =>
  queryOptions({ queryKey: ["doubles", pid, "changes"], queryFn: () => api.get<DoublesChangeDto[]>(`${base(pid)}/doubles/changes`) });
export const useDoublesChanges = (pid: string, enabled = true) => useQuery({ ...doublesChangesQueryOptions(pid), enabled });

export const useFabricOptions = (pid: string) =>
  useQuery({ queryKey: ["doubles", pid, "fabrics"], queryFn: () => api.get<DoublesFabricOptionDto[]>(`${base(pid)}/doubles/fabrics`) });

export const panelsQueryOptions = (pid: string, scope: DoublesScope) =>
  queryOptions({
    queryKey: ["doubles", pid, "panels", scope],
    queryFn: () => api.get<PanelDto[]>(`${base(pid)}/panels${qs({ ...scope })}`),
  });
export const usePanels = (pid: string, scope: DoublesScope) =>
  useQuery({ ...panelsQueryOptions(pid, scope), enabled: Boolean(scope.garmentId || scope.changeId) });

export const useSeams = (pid: string, scope: DoublesScope) =>
  useQuery({
    queryKey: ["doubles", pid, "seams", scope],
    queryFn: () => api.get<SeamDto[]>(`${base(pid)}/seams${qs({ ...scope })}`),
    enabled: Boolean(scope.garmentId || scope.changeId),
  });

export const usePhysics = (pid: string, scope: DoublesScope) =>
  useQuery({
    queryKey: ["doubles", pid, "physics", scope],
    queryFn: () => api.get<FabricPhysicsDto[]>(`${base(pid)}/doubles/physics${qs({ ...scope })}`),
    enabled: Boolean(scope.garmentId || scope.changeId),
  });

export const useMarker = (pid: string, input: MarkerInput | null) =>
  useQuery({
    queryKey: ["doubles", pid, "marker", input],
    queryFn: () =>
      api.get<MarkerDto | null>(
        `${base(pid)}/doubles/markers${qs({ scope: input!.scope, scopeId: input!.scopeId, multiples: input!.multiples })}`,
      ),
    enabled: Boolean(input),
  });

/** Invalidates everything the doubles screen shows (panels change seams, markers and counts). */
function useInvalidateDoubles(pid: string) {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: ["doubles", pid] });
}

export function useCreatePanel(pid: string) {
  const invalidate = useInvalidateDoubles(pid);
  return useMutation({ mutationFn: (input: CreatePanelInput) => api.post<PanelDto>(`${base(pid)}/panels`, input), onSuccess: invalidate });
}

export function useUpdatePanel(pid: string) {
  const invalidate = useInvalidateDoubles(pid);
  return useMutation({
    mutationFn: (p: { id: string; input: UpdatePanelInput }) => api.patch<PanelDto>(`${base(pid)}/panels/${p.id}`, p.input),
    onSuccess: invalidate,
  });
}

export function useDeletePanel(pid: string) {
  const invalidate = useInvalidateDoubles(pid);
  return useMutation({ mutationFn: (id: string) => api.delete(`${base(pid)}/panels/${id}`), onSuccess: invalidate });
}

/** What the DXF preview and import send besides the file. */
export interface DxfReadChoices {
  file: File;
  /** Units to read the drawing in; "" = what the file says. */
  units: DxfUnit | "";
  /** Seam allowance for pieces without a cut line in the file, mm. */
  seamAllowanceMm: number;
}

function dxfForm(p: DxfReadChoices, extra: Record<string, string> = {}): FormData {
  const form = new FormData();
  form.append("units", p.units);
  form.append("seamAllowanceMm", String(p.seamAllowanceMm));
  for (const [k, v] of Object.entries(extra)) form.append(k, v);
  form.append("file", p.file);
  return form;
}

export function useDxfPreview(pid: string) {
  return useMutation({ mutationFn: (p: DxfReadChoices) => api.upload<DxfImport>(`${base(pid)}/panels/dxf-preview`, dxfForm(p)) });
}

export function useDxfImport(pid: string) {
  const invalidate = useInvalidateDoubles(pid);
  return useMutation({
    mutationFn: (p: DxfReadChoices & { garmentId: string; fabricId: string }) =>
      api.upload<{ panels: PanelDto[]; warnings: string[]; skipped: string[] }>(
        `${base(pid)}/panels/dxf-import`,
        dxfForm(p, { garmentId: p.garmentId, fabricId: p.fabricId }),
      ),
    onSuccess: invalidate,
  });
}

export function useCreateSeam(pid: string) {
  const invalidate = useInvalidateDoubles(pid);
  return useMutation({ mutationFn: (input: CreateSeamInput) => api.post<SeamDto>(`${base(pid)}/seams`, input), onSuccess: invalidate });
}

export function useDeleteSeam(pid: string) {
  const invalidate = useInvalidateDoubles(pid);
  return useMutation({ mutationFn: (id: string) => api.delete(`${base(pid)}/seams/${id}`), onSuccess: invalidate });
}

export function useSaveMarker(pid: string) {
  const invalidate = useInvalidateDoubles(pid);
  return useMutation({
    mutationFn: (input: MarkerInput) => api.post<MarkerDto>(`${base(pid)}/doubles/markers`, input),
    onSuccess: invalidate,
  });
}
