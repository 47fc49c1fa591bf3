import type { ReactNode } from "react";
import { Navigate, Outlet, useLocation } from "react-router-dom";
import { NotAllowed } from "@/components/errors/not-allowed";
import type { Role } from "@/lib/roles";
import { useMe } from "../api/get-me";
import { roleHome } from "../roles";

/**
 * Lets through only the given roles. Anyone else who is signed in sees "Not allowed" at the same
 * URL (so they can tell which address it was); a signed-out visitor is sent to sign in first.
 */
export function RoleGate({ roles, children }: { roles: readonly Role[]; children?: ReactNode }) {
  const { data: user } = useMe();
  const location = useLocation();
  if (!user) return <Navigate to={signInPath(location.pathname + location.search)} replace />;
  if (!roles.includes(user.role)) {
    const home = roleHome(user.role);
    return <NotAllowed homePath={home.path} homeLabel={home.label} askAdministrator={user.role !== "admin"} />;
  }
  return children ?? <Outlet />;
}

export function signInPath(next: string): string {
  return next && next !== "/" ? `/sign-in?next=${encodeURIComponent(next)}` : "/sign-in";
}
