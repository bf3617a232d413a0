import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, qs } from "@/lib/api-client";
import type { CreatePacketInput, PacketDetailDto, PacketOptionsDto, PacketSummaryDto, UpdatePacketInput } from "@shared/schemas/packets";

const base = (pid: string) => `/productions/${pid}/packets`;

export const packetsQueryOptions = (pid: string, changeId?: string) =>
  queryOptions({
    queryKey: ["packets", pid, "list", changeId ?? "all"],
    queryFn: () => api.get<PacketSummaryDto[]>(`${base(pid)}${qs({ changeId })}`),
  });
export const usePackets = (pid: string, changeId?: string) => useQuery(packetsQueryOptions(pid, changeId));

export const usePacket = (pid: string, id: string | null) =>
  useQuery({
    queryKey: ["packets", pid, "detail", id],
    queryFn: () => api.get<PacketDetailDto>(`${base(pid)}/${id}`),
    enabled: Boolean(id),
  });

export const usePacketOptions = (pid: string, changeId: string | null) =>
  useQuery({
    queryKey: ["packets", pid, "options", changeId],
    queryFn: () => api.get<PacketOptionsDto>(`${base(pid)}/options${qs({ changeId })}`),
    enabled: Boolean(changeId),
  });

/** Where the browser downloads a packet's ZIP (a plain link, so the browser's own download shows progress). */
export const packetDownloadHref = (pid: string, id: string) => `/api${base(pid)}/${id}/download`;

function useInvalidatePackets(pid: string) {
  const qc = useQueryClient();
  return () => qc.invalidateQueries({ queryKey: ["packets", pid] });
}

export function useCreatePacket(pid: string) {
  const invalidate = useInvalidatePackets(pid);
  return useMutation({ mutationFn: (input: CreatePacketInput) => api.post<PacketDetailDto>(base(pid), input), onSuccess: invalidate });
}

export function useUpdatePacket(pid: string) {
  const invalidate = useInvalidatePackets(pid);
  return useMutation({
    mutationFn: (p: { id: string; input: UpdatePacketInput }) => api.patch<PacketDetailDto>(`${base(pid)}/${p.id}`, p.input),
    onSuccess: invalidate,
  });
}

export function useDeletePacket(pid: string) {
  const invalidate = useInvalidatePackets(pid);
  return useMutation({ mutationFn: (id: string) => api.delete(`${base(pid)}/${id}`), onSuccess: invalidate });
}

/** Publishes a draft; `onPublished` runs at hook level, so it fires even though the builder unmounts once the packet is published. */
export function usePublishPacket(pid: string, onPublished?: (p: PacketDetailDto) => void) {
  const invalidate = useInvalidatePackets(pid);
  return useMutation({
    mutationFn: (id: string) => api.post<PacketDetailDto>(`${base(pid)}/${id}/publish`),
    onSuccess: (p) => {
      onPublished?.(p);
      return invalidate();
    },
  });
}

/** How far a running publication is (files built, ZIP entries written); polled while publishing. */
export interface PublishProgress {
  stage: string;
  done: number;
  total: number;
  updatedAt: string;
}
export const usePublishProgress = (pid: string, id: string, running: boolean) =>
  useQuery({
    queryKey: ["packets", pid, "publish-progress", id],
    queryFn: () => api.get<PublishProgress | null>(`${base(pid)}/${id}/publish-progress`),
    enabled: running,
    refetchInterval: running ? 700 : false,
  });

export function useMarkReceived(pid: string) {
  const invalidate = useInvalidatePackets(pid);
  return useMutation({ mutationFn: (id: string) => api.post<PacketDetailDto>(`${base(pid)}/${id}/received`), onSuccess: invalidate });
}
