// Query and mutation hooks for the breakdown: scenes, shoot days, appearances, cast, changes,
// continuity and the CSV import. Keys: ["breakdown", pid, ...].
import { keepPreviousData, queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, qs } from "@/lib/api-client";
import type {
  AppearanceDto,
  AppearanceInput,
  ImportPreviewDto,
  ImportResultDto,
  MoveSceneInput,
  SceneDetailDto,
  SceneDto,
  SceneInput,
  SceneRowDto,
  ShootDayDto,
  ShootDayInput,
  UpdateAppearanceInput,
  UpdateShootDayInput,
} from "@shared/schemas/breakdown";
import type { CharacterDto, CharacterInput, CharacterScheduleDto, PerformerDto, PerformerInput } from "@shared/schemas/cast";
import type { ChangeApproval, ChangeDto, ChangeInput, UpdateChangeInput } from "@shared/schemas/changes";
import type { ContinuityEntryDto, ContinuityTimelineDto } from "@shared/schemas/continuity";

const base = (pid: string) => `/productions/${pid}`;
const key = (pid: string, ...rest: unknown[]) => ["breakdown", pid, ...rest];

export const scenesQueryOptions = (pid: string) =>
  queryOptions({
    queryKey: key(pid, "scenes"),
    queryFn: () => api.get<SceneRowDto[]>(`${base(pid)}/scenes?pageSize=5000`),
    placeholderData: keepPreviousData,
  });
/** Every scene of the production (the table virtualises rows). */
export const useScenes = (pid: string) => useQuery(scenesQueryOptions(pid));
/** One scene page. */
export const useScene = (pid: string, id: string) =>
  useQuery({ queryKey: key(pid, "scene", id), queryFn: () => api.get<SceneDetailDto>(`${base(pid)}/scenes/${id}`), enabled: Boolean(id) });
/** Shoot days (or performances) with their scenes. */
export const useShootDays = (pid: string) =>
  useQuery({ queryKey: key(pid, "shoot-days"), queryFn: () => api.get<ShootDayDto[]>(`${base(pid)}/shoot-days?pageSize=2000`) });
/** Characters in cast order. */
export const useCharacters = (pid: string) =>
  useQuery({ queryKey: key(pid, "characters"), queryFn: () => api.get<CharacterDto[]>(`${base(pid)}/characters`) });
/** Performers with their roles. */
export const usePerformers = (pid: string, enabled = true) =>
  useQuery({ queryKey: key(pid, "performers"), queryFn: () => api.get<PerformerDto[]>(`${base(pid)}/performers`), enabled });
/** A character's scenes in story and shoot order. */
export const useCharacterSchedule = (pid: string, id: string) =>
  useQuery({
    queryKey: key(pid, "schedule", id),
    queryFn: () => api.get<CharacterScheduleDto>(`${base(pid)}/characters/${id}/schedule`),
    enabled: Boolean(id),
  });
/** Changes, optionally of one character. */
export const useChanges = (pid: string, characterId?: string) =>
  useQuery({
    queryKey: key(pid, "changes", characterId ?? "all"),
    queryFn: () => api.get<ChangeDto[]>(`${base(pid)}/changes${qs({ characterId })}`),
  });
/** Continuity entries filtered by scene/character/shoot day. */
export const useContinuityEntries = (pid: string, f: { sceneId?: string; characterId?: string; shootDayId?: string }, enabled = true) =>
  useQuery({
    queryKey: key(pid, "continuity", f),
    queryFn: () => api.get<ContinuityEntryDto[]>(`${base(pid)}/continuity${qs(f)}`),
    enabled,
  });
/** A character's continuity timeline in story order. */
export const useContinuityTimeline = (pid: string, characterId: string) =>
  useQuery({
    queryKey: key(pid, "timeline", characterId),
    queryFn: () => api.get<ContinuityTimelineDto>(`${base(pid)}/continuity/timeline/${characterId}`),
    enabled: Boolean(characterId),
  });

function useInvalidate(pid: string) {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: ["breakdown", pid] });
}

/**
 * After a change to the schedule or a scene: snags (bookings, multiples, rentals…) and the workroom
 * plan (due dates come from shoot days) are computed from it, so they are fetched again too.
 */
function useInvalidateSchedule(pid: string) {
  const qc = useQueryClient();
  return () =>
    Promise.all(
      [
        ["breakdown", pid],
        ["snags", pid],
        ["workroom", pid],
      ].map((queryKey) => qc.invalidateQueries({ queryKey })),
    );
}

/** Adds a scene. */
export function useCreateScene(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({ mutationFn: (input: Partial<SceneInput>) => api.post(`${base(pid)}/scenes`, input), onSuccess: invalidate });
}
/** Edits a scene. */
export function useUpdateScene(pid: string, id: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({
    mutationFn: (input: Partial<SceneInput>) => api.patch<SceneDto>(`${base(pid)}/scenes/${id}`, input),
    onSuccess: invalidate,
  });
}
/** Deletes a scene with its appearances and continuity (ask first). */
export function useDeleteScene(pid: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({ mutationFn: (id: string) => api.delete(`${base(pid)}/scenes/${id}`), onSuccess: invalidate });
}
/** Adds a shoot day or performance. */
export function useCreateShootDay(pid: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({
    mutationFn: (input: Partial<ShootDayInput>) => api.post<ShootDayDto>(`${base(pid)}/shoot-days`, input),
    onSuccess: invalidate,
  });
}
/** Edits a shoot day; `sceneIds` replaces its scene order. */
export function useUpdateShootDay(pid: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateShootDayInput & { id: string }) => api.patch<ShootDayDto>(`${base(pid)}/shoot-days/${id}`, input),
    onSuccess: invalidate,
  });
}
/** Moves a scene from one shoot day to another. */
export function useMoveScene(pid: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({
    mutationFn: ({ fromId, ...input }: MoveSceneInput & { fromId: string }) =>
      api.post<{ from: ShootDayDto; to: ShootDayDto }>(`${base(pid)}/shoot-days/${fromId}/move-scene`, input),
    onSuccess: invalidate,
  });
}
/** Deletes a shoot day or performance (ask first). */
export function useDeleteShootDay(pid: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({ mutationFn: (id: string) => api.delete(`${base(pid)}/shoot-days/${id}`), onSuccess: invalidate });
}
/** Puts a character in a scene. */
export function useCreateAppearance(pid: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({
    mutationFn: (input: Partial<AppearanceInput>) => api.post<AppearanceDto>(`${base(pid)}/appearances`, input),
    onSuccess: invalidate,
  });
}
/** Edits the change or state of an appearance. */
export function useUpdateAppearance(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (p: { id: string; input: UpdateAppearanceInput }) => api.patch<AppearanceDto>(`${base(pid)}/appearances/${p.id}`, p.input),
    onSuccess: invalidate,
  });
}
/** Removes an appearance. */
export function useDeleteAppearance(pid: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({ mutationFn: (id: string) => api.delete(`${base(pid)}/appearances/${id}`), onSuccess: invalidate });
}
/** Checks a CSV without saving. */
export function useImportPreview(pid: string) {
  return useMutation({ mutationFn: (csv: string) => api.post<ImportPreviewDto>(`${base(pid)}/imports/breakdown/preview`, { csv }) });
}
/** Imports a CSV (all rows or none). */
export function useImportBreakdown(pid: string) {
  const invalidate = useInvalidateSchedule(pid);
  return useMutation({
    mutationFn: (p: { csv: string; fileName?: string }) => api.post<ImportResultDto>(`${base(pid)}/imports/breakdown`, p),
    onSuccess: invalidate,
  });
}
/** Adds a performer. */
export function useCreatePerformer(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (input: Partial<PerformerInput>) => api.post<PerformerDto>(`${base(pid)}/performers`, input),
    onSuccess: invalidate,
  });
}
/** Edits a performer. */
export function useUpdatePerformer(pid: string, id: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (input: Partial<PerformerInput>) => api.patch<PerformerDto>(`${base(pid)}/performers/${id}`, input),
    onSuccess: invalidate,
  });
}
/** Adds a character. */
export function useCreateCharacter(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (input: Partial<CharacterInput>) => api.post<CharacterDto>(`${base(pid)}/characters`, input),
    onSuccess: invalidate,
  });
}
/** Edits a character (doubles replace the list). */
export function useUpdateCharacter(pid: string, id: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (input: Partial<CharacterInput>) => api.patch<CharacterDto>(`${base(pid)}/characters/${id}`, input),
    onSuccess: invalidate,
  });
}
/** Adds a change. */
export function useCreateChange(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (input: Partial<ChangeInput>) => api.post<ChangeDto>(`${base(pid)}/changes`, input),
    onSuccess: invalidate,
  });
}
/** Edits a change (items replace the list). */
export function useUpdateChange(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (p: { id: string; input: UpdateChangeInput }) => api.patch<ChangeDto>(`${base(pid)}/changes/${p.id}`, p.input),
    onSuccess: invalidate,
  });
}
/** Sets a change's approval state. */
export function useSetApproval(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (p: { id: string; approval: ChangeApproval }) =>
      api.put<ChangeDto>(`${base(pid)}/changes/${p.id}/approval`, { approval: p.approval }),
    onSuccess: invalidate,
  });
}
/** Logs a continuity entry with photos in one request. */
export function useLogContinuity(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({
    mutationFn: (form: FormData) => api.upload<ContinuityEntryDto>(`${base(pid)}/continuity`, form),
    onSuccess: invalidate,
  });
}
/** Deletes a continuity entry. */
export function useDeleteContinuity(pid: string) {
  const invalidate = useInvalidate(pid);
  return useMutation({ mutationFn: (id: string) => api.delete(`${base(pid)}/continuity/${id}`), onSuccess: invalidate });
}
