/** Every client URL in one place. */
export const paths = {
  home: { path: "/", getHref: () => "/" },
  auth: {
    login: {
      path: "/login",
      getHref: (redirectTo?: string | null) => `/login${redirectTo ? `?redirectTo=${encodeURIComponent(redirectTo)}` : ""}`,
    },
    forgot: { path: "/forgot-password", getHref: () => "/forgot-password" },
    reset: { path: "/reset-password/:token", getHref: (token: string) => `/reset-password/${token}` },
    invitation: { path: "/invitations/:token", getHref: (token: string) => `/invitations/${token}` },
  },
  productions: {
    new: { path: "/productions/new", getHref: () => "/productions/new" },
  },
  production: {
    root: { path: "/p/:productionId", getHref: (id: string) => `/p/${id}` },
    screen: { path: "/p/:productionId/:screen", getHref: (id: string, screen: string) => `/p/${id}/${screen}` },
  },
} as const;
