import { lazy, Suspense } from "react";
import { Navigate, Outlet, useLocation, useNavigate } from "react-router-dom";
import { AppLayout, type NavItem } from "@/components/layouts/app-layout";
import { useMe } from "@/features/auth/api/get-me";
import { useLogout } from "@/features/auth/api/logout";
import { signInPath } from "@/features/auth/components/role-gate";
import { roleHome } from "@/features/auth/roles";
import { roleLabels, type Role } from "@/lib/roles";

// Tenants get their own shell, in their language: loaded only for them, so staff (and the officers'
// queue's first rows, bench:queue) never download the language machinery.
const TenantRoot = lazy(() => import("./tenant-root"));

const navByRole: Record<Exclude<Role, "tenant">, NavItem[]> = {
  officer: [
    { to: "/queue", label: "Case queue" },
    { to: "/alerts", label: "Alerts" },
    { to: "/homes", label: "Homes" },
    { to: "/sensors", label: "Sensors", end: true },
    { to: "/dashboard", label: "Dashboard" },
    { to: "/calculator", label: "Calculator" },
  ],
  maintenance: [
    { to: "/works", label: "Works" },
    { to: "/homes", label: "Homes" },
    { to: "/sensors", label: "Sensors", end: true },
    { to: "/sensors/health", label: "Sensor health" },
    { to: "/dashboard", label: "Dashboard" },
    { to: "/calculator", label: "Calculator" },
  ],
  admin: [
    { to: "/admin", label: "Users and invitations", end: true },
    { to: "/admin/policy", label: "Deadline policy" },
    { to: "/admin/emails", label: "E-mails" },
    { to: "/admin/integrations", label: "Integrations" },
    { to: "/admin/webhooks", label: "Webhooks" },
    { to: "/admin/tenancy-import", label: "Tenancy import" },
    { to: "/admin/stock-import", label: "Import homes" },
    { to: "/queue", label: "Case queue" },
    { to: "/alerts", label: "Alerts" },
    { to: "/works", label: "Works" },
    { to: "/homes", label: "Homes" },
    { to: "/sensors", label: "Sensors", end: true },
    { to: "/sensors/health", label: "Sensor health" },
    { to: "/dashboard", label: "Dashboard" },
    { to: "/calculator", label: "Calculator" },
  ],
};

export default function AppRoot() {
  const { data: user } = useMe();
  const location = useLocation();
  const navigate = useNavigate();
  const logout = useLogout({ onSuccess: () => navigate("/sign-in", { replace: true, state: { signedOut: true } }) });

  // The session ended while the page was open (or someone signed out in another way).
  if (!user) {
    if (logout.isPending || logout.isSuccess) return null;
    return <Navigate to={signInPath(location.pathname + location.search)} replace />;
  }

  if (user.role === "tenant") {
    return (
      <Suspense fallback={null}>
        <TenantRoot userName={user.name} onSignOut={() => logout.mutate()} signingOut={logout.isPending} />
      </Suspense>
    );
  }

  return (
    <AppLayout
      variant="staff"
      userName={user.name}
      roleLabel={roleLabels[user.role]}
      homePath={roleHome(user.role).path}
      nav={navByRole[user.role]}
      onSignOut={() => logout.mutate()}
      signingOut={logout.isPending}
    >
      <Outlet />
    </AppLayout>
  );
}
