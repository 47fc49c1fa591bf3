import type { QueryClient } from "@tanstack/react-query";
import { createBrowserRouter, redirect, RouterProvider, type LoaderFunction, type RouteObject } from "react-router-dom";
import { RootRouteError, RouteError } from "@/components/errors/route-error";
import { LoadingState } from "@/components/ui/spinner";
import { meQueryOptions } from "@/features/auth/api/get-me";
import { RoleGate, signInPath } from "@/features/auth/components/role-gate";
import { roleHome } from "@/features/auth/roles";
import { estatesQueryOptions } from "@/features/properties/api/get-estates";
import { prefetchCaseQueue } from "@/features/queue/api/prefetch-queue";
import { markPageEnglish } from "@/lib/i18n/choice";
import type { Role } from "@/lib/roles";
import { WaitingNote } from "./waiting-note";

/** What a lazily loaded route module may export: the page (default) and a loader that warms the cache. */
interface RouteModule {
  default: React.ComponentType;
  clientLoader?: (queryClient: QueryClient) => LoaderFunction;
}

const lazyRoute = (queryClient: QueryClient, load: () => Promise<RouteModule>) => async () => {
  const { default: Component, clientLoader } = await load();
  return { Component, ...(clientLoader ? { loader: clientLoader(queryClient) } : {}) };
};

/** Signed-out visitors are sent to sign in, and come back here afterwards. */
const requireUser =
  (queryClient: QueryClient): LoaderFunction =>
  async ({ request }) => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    if (!user) {
      const url = new URL(request.url);
      throw redirect(signInPath(url.pathname + url.search));
    }
    // A tenant's pages wait for their language's text (no English before Welsh); staff stay in English
    // and never load the language machinery.
    if (user.role === "tenant") await (await import("./routes/app/tenant-root")).prepareTenantLanguage(user);
    else markPageEnglish();
    return null;
  };

/** `/` goes to each role's own first screen. */
const startPage =
  (queryClient: QueryClient): LoaderFunction =>
  async () => {
    const user = await queryClient.ensureQueryData(meQueryOptions());
    throw redirect(user ? roleHome(user.role).path : "/sign-in");
  };

/**
 * The queue asks for its cases as the navigation starts, beside the session check and the page's own
 * code, not after them: waiting for /api/auth/me first put a whole round trip before the first rows
 * (bench:queue). A visitor who may not see the queue gets a 401 or 403 for it, shown nowhere.
 */
const prefetchQueue =
  (queryClient: QueryClient): LoaderFunction =>
  ({ request }) => {
    prefetchCaseQueue(queryClient, request.url);
    void queryClient.prefetchQuery(estatesQueryOptions());
    return null;
  };

const STAFF: readonly Role[] = ["officer", "maintenance", "admin"];

export function createAppRoutes(queryClient: QueryClient): RouteObject[] {
  const page = (path: string, load: () => Promise<RouteModule>): RouteObject => ({
    path,
    lazy: lazyRoute(queryClient, load),
    errorElement: <RouteError />,
  });
  const gate = (roles: readonly Role[], children: RouteObject[]): RouteObject => ({
    element: <RoleGate roles={roles} />,
    errorElement: <RouteError />,
    children,
  });

  return [
    {
      id: "root",
      errorElement: <RootRouteError />,
      hydrateFallbackElement: <LoadingState className="justify-center py-20">Opening Dewline…</LoadingState>,
      children: [
        { index: true, loader: startPage(queryClient), element: <LoadingState />, errorElement: <RootRouteError /> },
        {
          // Pages anyone may open.
          lazy: lazyRoute(queryClient, () => import("./routes/public/root")),
          errorElement: <RootRouteError />,
          children: [
            page("sign-in", () => import("./routes/auth/sign-in")),
            page("forgot-password", () => import("./routes/auth/forgot-password")),
            page("reset-password/:token", () => import("./routes/auth/reset-password")),
            page("unlock-sign-in/:token", () => import("./routes/auth/unlock-sign-in")),
            page("invitation/:token", () => import("./routes/auth/invitation")),
            page("calculator", () => import("./routes/public/calculator")),
            page("*", () => import("./routes/not-found")),
          ],
        },
        {
          // The signed-in area: header, navigation and sign-out around every page.
          id: "app",
          loader: requireUser(queryClient),
          lazy: async () => ({ Component: (await import("./routes/app/root")).default }),
          // Opened with no signal, the session cannot be checked: a report kept on this phone is still mentioned.
          errorElement: (
            <>
              <RootRouteError />
              <WaitingNote />
            </>
          ),
          children: [
            gate(
              ["tenant"],
              [
                page("home", () => import("./routes/tenant/home")),
                page("report", () => import("./routes/tenant/report")),
                page("cases", () => import("./routes/tenant/cases")),
              ],
            ),
            // The same address for a tenant's page and the staff workspace: the module picks by role.
            gate(["tenant", ...STAFF], [page("cases/:id", () => import("./routes/app/case"))]),
            // Admins open every staff screen, the queue and the works board included.
            gate(
              ["officer", "admin"],
              [
                // A loader defined here runs alongside the lazy module's download; one returned by it would wait for it.
                { ...page("queue", () => import("./routes/staff/queue")), loader: prefetchQueue(queryClient) },
                page("alerts", () => import("./routes/staff/alerts")),
              ],
            ),
            gate(["maintenance", "admin"], [page("works", () => import("./routes/staff/works"))]),
            gate(STAFF, [
              page("sensors", () => import("./routes/staff/sensors")),
              page("sensors/:id", () => import("./routes/staff/sensors-device")),
            ]),
            gate(STAFF, [
              page("homes", () => import("./routes/staff/homes")),
              page("homes/:id", () => import("./routes/staff/home")),
              page("dashboard", () => import("./routes/staff/dashboard")),
              page("sensors/health", () => import("./routes/staff/sensor-health")),
            ]),
            gate(["officer", "admin"], [page("log-report", () => import("./routes/staff/log-report"))]),
            gate(["admin"], [page("homes/new", () => import("./routes/admin/new-home"))]),
            gate(
              ["admin"],
              [
                page("admin", () => import("./routes/admin/users")),
                page("admin/policy", () => import("./routes/admin/policy")),
                page("admin/emails", () => import("./routes/admin/emails")),
                page("admin/integrations", () => import("./routes/admin/integrations")),
                page("admin/webhooks", () => import("./routes/admin/webhooks")),
                page("admin/tenancy-import", () => import("./routes/admin/tenancy-import")),
                page("admin/stock-import", () => import("./routes/admin/stock-import")),
              ],
            ),
          ],
        },
      ],
    },
  ];
}

/**
 * The browser's router. Made before React's first render (src/main.tsx): making it starts the page's
 * loaders and the download of its code, so they run while React sets up, not after it (bench:queue).
 */
export const createAppRouter = (queryClient: QueryClient) => createBrowserRouter(createAppRoutes(queryClient));

export function AppRouter({ router }: { router: ReturnType<typeof createAppRouter> }) {
  return <RouterProvider router={router} />;
}
