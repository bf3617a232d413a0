import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, resetCsrfToken } from "@/lib/api-client";
import type { LoginInput, MeDto, InvitationPreviewDto, AcceptInvitationInput } from "@shared/schemas/auth";
import { ApiError } from "@/lib/api-client";

/** The signed-in user, or null when signed out. */
export async function getMe(): Promise<MeDto | null> {
  try {
    return await api.get<MeDto>("/auth/me");
  } catch (err) {
    if (err instanceof ApiError && err.status === 401) return null;
    throw err;
  }
}

export const meQueryOptions = () => queryOptions({ queryKey: ["me"], queryFn: getMe, staleTime: 60_000 });
export const useMe = () => useQuery(meQueryOptions());

export function useLogin() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: LoginInput) => api.post<MeDto>("/auth/login", input),
    onSuccess: (me) => {
      resetCsrfToken();
      qc.setQueryData(["me"], me);
    },
  });
}

export function useLogout() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => api.post<void>("/auth/logout"),
    onSettled: () => {
      resetCsrfToken();
      qc.clear();
      qc.setQueryData(["me"], null);
    },
  });
}

export function useRequestPasswordReset() {
  return useMutation({ mutationFn: (input: { email: string }) => api.post<{ message: string }>("/auth/password-reset", input) });
}

export function useResetPassword() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: { token: string; password: string }) => api.post<MeDto>("/auth/password-reset/confirm", input),
    onSuccess: (me) => {
      resetCsrfToken();
      qc.setQueryData(["me"], me);
    },
  });
}

export const invitationQueryOptions = (token: string) =>
  queryOptions({ queryKey: ["invitation", token], queryFn: () => api.get<InvitationPreviewDto>(`/invitations/${token}`), retry: false });

export function useAcceptInvitation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: AcceptInvitationInput) => api.post<{ productionId: string; me: MeDto }>("/invitations/accept", input),
    onSuccess: (res) => {
      resetCsrfToken();
      qc.setQueryData(["me"], res.me);
      qc.invalidateQueries({ queryKey: ["productions"] });
    },
  });
}
