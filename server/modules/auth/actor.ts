import type { Role } from "../users/user.entity.js";

/** The signed-in user as every service sees it (also `req.user`). */
export interface Actor {
  id: number;
  email: string;
  name: string;
  role: Role;
  organisationId: number;
}

export const isStaff = (actor: Actor) => actor.role !== "tenant";
