import type { Role } from "../../src/lib/roles.js";

/**
 * The signed-in user as every service sees it (also `req.user`). Here rather than in the auth
 * module because every module needs it, including users, properties and tenancies, which auth
 * itself calls.
 */
export interface Actor {
  id: number;
  email: string;
  name: string;
  role: Role;
  organisationId: number;
}

export const isStaff = (actor: Actor) => actor.role !== "tenant";
