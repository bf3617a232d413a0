import { lazy, Suspense, useEffect } from "react";
import { createBrowserRouter, Navigate, Outlet, RouterProvider, useLocation, useNavigate } from "react-router-dom";
import { useQueryClient } from "@tanstack/react-query";
import { paths } from "@/config/paths";
import { setUnauthorizedHandler } from "@/lib/api-client";
import { isAuthPath, useMe } from "@/features/auth/api/auth";
import { Spinner, ErrorAlert } from "@/components/ui/feedback";
import { AppShell } from "@/components/layouts/app-shell";
import { ScreenRoute } from "./routes/app/screen-route";

const LoginPage = lazy(() => import("./routes/auth/login"));
const ForgotPasswordPage = lazy(() => import("./routes/auth/forgot-password"));
const ResetPasswordPage = lazy(() => import("./routes/auth/reset-password"));
const InvitationPage = lazy(() => import("./routes/auth/invitation"));
const NewProductionPage = lazy(() => import("./routes/app/new-production"));
const HomeRedirect = lazy(() => import("./routes/app/home"));

/** Sends signed-out visitors to the sign-in page and back afterwards. */
function RequireSignedIn() {
  const me = useMe();
  const location = useLocation();
  const navigate = useNavigate();
  const qc = useQueryClient();
  useEffect(() => {
    setUnauthorizedHandler(() => {
      qc.setQueryData(["me"], null);
      const here = window.location.pathname + window.location.search;
      // Already on a sign-in page (e.g. while signing out): go there plainly, never "back to /login".
      void navigate(paths.auth.login.getHref(isAuthPath(window.location.pathname) ? null : here));
    });
  }, [navigate, qc]);
  if (me.isPending) return <Spinner className="p-8" />;
  if (me.error)
    return (
      <div className="p-8">
        <ErrorAlert error={me.error} title="Cannot reach the server" />
      </div>
    );
  if (!me.data) return <Navigate to={paths.auth.login.getHref(location.pathname + location.search)} replace />;
  return <Outlet />;
}

function Lazy() {
  return (
    <Suspense fallback={<Spinner className="p-8" />}>
      <Outlet />
    </Suspense>
  );
}

const router = createBrowserRouter([
  {
    element: <Lazy />,
    children: [
      { path: paths.auth.login.path, element: <LoginPage /> },
      { path: paths.auth.forgot.path, element: <ForgotPasswordPage /> },
      { path: paths.auth.reset.path, element: <ResetPasswordPage /> },
      { path: paths.auth.invitation.path, element: <InvitationPage /> },
      {
        element: <RequireSignedIn />,
        children: [
          { path: paths.home.path, element: <HomeRedirect /> },
          { path: paths.productions.new.path, element: <NewProductionPage /> },
          {
            path: paths.production.root.path,
            element: <AppShell />,
            children: [
              { index: true, element: <Navigate to="today" replace /> },
              { path: ":screen/*", element: <ScreenRoute /> },
            ],
          },
        ],
      },
      { path: "*", element: <Navigate to="/" replace /> },
    ],
  },
]);

export function AppRouter() {
  return <RouterProvider router={router} />;
}
