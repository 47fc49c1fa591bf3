import type { Me } from "@/lib/contracts";
import { STAFF_ROLES, type Role } from "@/lib/roles";

/** The signed-in user (GET /api/auth/me). */
export type User = Me;

const roleHomes: Record<Role, { path: string; label: string }> = {
  tenant: { path: "/home", label: "My home" },
  officer: { path: "/queue", label: "Case queue" },
  maintenance: { path: "/works", label: "Works" },
  admin: { path: "/admin", label: "Users and invitations" },
};

/** The first screen each role sees after signing in. */
export function roleHome(role: Role): { path: string; label: string } {
  return roleHomes[role];
}

export const isStaff = (role: Role) => (STAFF_ROLES as readonly Role[]).includes(role);

/** Only same-site paths may be used as the place to return to after signing in. */
export function safeNextPath(next: string | null | undefined): string | null {
  if (!next || !next.startsWith("/") || next.startsWith("//") || next.startsWith("/\\")) return null;
  if (next.startsWith("/sign-in")) return null;
  return next;
}
