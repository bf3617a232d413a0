import { queryOptions, useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, resetCsrfToken } from "@/lib/api-client";
import type { LoginInput, MeDto, InvitationPreviewDto, AcceptInvitationInput } from "@shared/schemas/auth";
import { ApiError } from "@/lib/api-client";
import { isOfflineCopy } from "@/lib/offline/fallback";
import { forgetAccount, rememberAccount } from "@/lib/offline/store";
import { queueRunner } from "@/lib/offline/runner";
import { paths } from "@/config/paths";

// A sign-out made without a signal cleared this device at once; the server's session ends when the
// connection is back (before anything else is asked).
const SIGN_OUT_PENDING = "seamscene.signOutPending";

function signOutPending(): boolean {
  try {
    return localStorage.getItem(SIGN_OUT_PENDING) === "1";
  } catch {
    return false;
  }
}

function setSignOutPending(on: boolean): void {
  try {
    if (on) localStorage.setItem(SIGN_OUT_PENDING, "1");
    else localStorage.removeItem(SIGN_OUT_PENDING);
  } catch {
    /* private mode: nothing to remember */
  }
}

/** The signed-in user, or null when signed out. Without a signal: the account last signed in here. */
export async function getMe(): Promise<MeDto | null> {
  if (signOutPending()) {
    try {
      await api.post<void>("/auth/logout");
      setSignOutPending(false);
      resetCsrfToken();
    } catch (err) {
      if (err instanceof ApiError && err.status === 0) return null;
      setSignOutPending(false);
    }
  }
  try {
    const me = await api.get<MeDto>("/auth/me");
    if (!isOfflineCopy(me)) void rememberAccount(me).catch(() => undefined);
    return me;
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
      void rememberAccount(me).catch(() => undefined);
      // Records that waited for a new sign-in go now.
      queueRunner.kick(true);
    },
  });
}

/**
 * Signs out and deletes this account's offline data from the device: its queue (the screen asks
 * first when records wait), its offline packs and saved thumbnails.
 */
export function useLogout() {
  return useMutation({
    mutationFn: async (userId: string | undefined) => {
      try {
        await api.post<void>("/auth/logout");
      } catch (err) {
        if (!(err instanceof ApiError && err.status === 0)) throw err;
        setSignOutPending(true);
      } finally {
        queueRunner.stop();
        if (userId) await forgetAccount(userId).catch(() => undefined);
      }
    },
    onSettled: () => {
      resetCsrfToken();
      window.location.replace(paths.auth.login.getHref());
    },
  });
}

/** Whether a pathname is one of the sign-in pages (never a place to return to after signing in). */
export function isAuthPath(pathname: string): boolean {
  return (
    pathname === paths.auth.login.path ||
    pathname === paths.auth.forgot.path ||
    pathname.startsWith("/reset-password/") ||
    pathname.startsWith("/invitations/")
  );
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
      void qc.invalidateQueries({ queryKey: ["productions"] });
    },
  });
}
