import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, resetCsrfToken } from "@/lib/api-client";
import type { LoginInput, MeDto, InvitationPreviewDto, AcceptInvitationInput } from "@shared/schemas/auth";
import { ApiError } from "@/lib/api-client";
import { paths } from "@/config/paths";

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

/**
 * Signs out and lands on the plain sign-in page. A full page load (not a client-side navigation)
 * drops every cached query at once, so no screen still on the page can refetch, get a 401 and
 * send the person to "/login?redirectTo=/login".
 */
export function useLogout() {
  return useMutation({
    mutationFn: () => api.post<void>("/auth/logout"),
    onSettled: () => {
      resetCsrfToken();
      window.location.replace(paths.auth.login.getHref());
    },
  });
}

/** Whether a pathname is one of the sign-in pages (never a place to return to after signing in). */
export function isAuthPath(pathname: string): boolean {
  return pathname === paths.auth.login.path || pathname === paths.auth.forgot.path || pathname.startsWith("/reset-password/") || pathname.startsWith("/invitations/");
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
