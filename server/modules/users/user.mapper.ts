import type { Actor } from "../../lib/actor.js";
import type { User } from "./user.entity.js";

export const toMeDto = (a: Actor) => ({ id: a.id, email: a.email, name: a.name, role: a.role, organisationId: a.organisationId });

export const toUserDto = (u: User) => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  status: u.status,
  lastSignInAt: u.lastSignInAt?.toISOString() ?? null,
  createdAt: u.createdAt.toISOString(),
});
