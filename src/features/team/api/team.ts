import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { InvitationDto, InviteMemberInput, MemberDto, OutboxMessageDto } from "@shared/schemas/members";
import type { Role } from "@shared/permissions";

const base = (pid: string) => `/productions/${pid}`;

export const membersQueryOptions = (pid: string) =>
  queryOptions({ queryKey: ["members", pid], queryFn: () => api.get<MemberDto[]>(`${base(pid)}/members`) });
export const useMembers = (pid: string) => useQuery(membersQueryOptions(pid));

export const invitationsQueryOptions = (pid: string) =>
  queryOptions({ queryKey: ["invitations", pid], queryFn: () => api.get<InvitationDto[]>(`${base(pid)}/invitations`) });
export const useInvitations = (pid: string) => useQuery(invitationsQueryOptions(pid));

export const outboxQueryOptions = (pid: string) =>
  queryOptions({ queryKey: ["outbox", pid], queryFn: () => api.get<OutboxMessageDto[]>(`${base(pid)}/outbox?pageSize=50`), retry: false });
export const useOutbox = (pid: string, enabled: boolean) => useQuery({ ...outboxQueryOptions(pid), enabled });

export function useInviteMember(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: InviteMemberInput) => api.post<InvitationDto>(`${base(pid)}/invitations`, input),
    onSuccess: () => {
      void qc.invalidateQueries({ queryKey: ["invitations", pid] });
      void qc.invalidateQueries({ queryKey: ["outbox", pid] });
    },
  });
}

export function useRevokeInvitation(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete(`${base(pid)}/invitations/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["invitations", pid] }),
  });
}

export function useUpdateMemberRole(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (p: { id: string; role: Role }) => api.patch<MemberDto>(`${base(pid)}/members/${p.id}`, { role: p.role }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["members", pid] }),
  });
}

export function useRemoveMember(pid: string) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (id: string) => api.delete(`${base(pid)}/members/${id}`),
    onSuccess: () => qc.invalidateQueries({ queryKey: ["members", pid] }),
  });
}

export const auditQueryOptions = (pid: string) =>
  queryOptions({
    queryKey: ["audit", pid],
    queryFn: () => api.get<import("@shared/schemas/productions").AuditEventDto[]>(`${base(pid)}/audit?pageSize=30`),
  });
export const useAuditEvents = (pid: string) => useQuery(auditQueryOptions(pid));
