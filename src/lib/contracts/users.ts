import { z } from "zod";
import { ROLES } from "../roles.js";
import { id, instant, pageOf } from "./common.js";

export const USER_STATUSES = ["invited", "active", "disabled", "cancelled"] as const;
export type UserStatus = (typeof USER_STATUSES)[number];

/** An account as the admin's table shows it (GET /api/users, PATCH /api/users/:id). */
export const userResponse = z.object({
  id,
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  status: z.enum(USER_STATUSES),
  lastSignInAt: instant.nullable(),
  createdAt: instant,
});
export type UserResponse = z.infer<typeof userResponse>;
export const userPageResponse = pageOf(userResponse);
export type UserPageResponse = z.infer<typeof userPageResponse>;

/** What an admin can do to an account, as its history records it (GET /api/users/:id/history). */
export const USER_AUDIT_ACTIONS = [
  "invited",
  "invitation-resent",
  "invitation-cancelled",
  "invitation-accepted",
  "name-changed",
  "role-changed",
  "disabled",
  "enabled",
] as const;
export type UserAuditAction = (typeof USER_AUDIT_ACTIONS)[number];

export const userAuditEntry = z.object({
  id,
  action: z.enum(USER_AUDIT_ACTIONS),
  /** Who did it; null when that account is not this landlord's (never expected). */
  actor: z.object({ id, name: z.string() }).nullable(),
  /** The value before and after (a name, or a role such as "officer"), when the action has one. */
  from: z.string().nullable(),
  to: z.string().nullable(),
  at: instant,
});
export type UserAuditEntry = z.infer<typeof userAuditEntry>;
export const userHistoryResponse = z.object({ entries: z.array(userAuditEntry) });
export type UserHistoryResponse = z.infer<typeof userHistoryResponse>;

/** GET /api/staff: who a case can be assigned to. */
export const staffMember = z.object({ id, name: z.string(), role: z.enum(ROLES) });
export type StaffMember = z.infer<typeof staffMember>;
export const staffListResponse = z.object({ users: z.array(staffMember) });
