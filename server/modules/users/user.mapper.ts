import type { z } from "zod";
import type { meResponse } from "../../../src/lib/contracts/auth.js";
import type { staffMember, userAuditEntry, userResponse } from "../../../src/lib/contracts/users.js";
import type { Actor } from "../../lib/actor.js";
import type { User } from "./user.entity.js";
import type { UserAuditRecord } from "./user.service.js";

export const toMeDto = (a: Actor, language: string | null): z.input<typeof meResponse> => ({
  id: a.id,
  email: a.email,
  name: a.name,
  role: a.role,
  organisationId: a.organisationId,
  language,
});

export const toUserDto = (u: User): z.input<typeof userResponse> => ({
  id: u.id,
  email: u.email,
  name: u.name,
  role: u.role,
  status: u.status,
  lastSignInAt: u.lastSignInAt?.toISOString() ?? null,
  createdAt: u.createdAt.toISOString(),
});

export const toStaffMemberDto = (u: User): z.input<typeof staffMember> => ({ id: u.id, name: u.name, role: u.role });

export const toUserAuditDto = (e: UserAuditRecord): z.input<typeof userAuditEntry> => ({
  id: e.id,
  action: e.action,
  actor: e.actor,
  from: e.from,
  to: e.to,
  at: e.at.toISOString(),
});
