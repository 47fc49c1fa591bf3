import { z } from "zod";
import { ROLES } from "../roles.js";
import { id, instant, pageOf } from "./common.js";

export const USER_STATUSES = ["invited", "active", "disabled"] as const;
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

/** GET /api/staff: who a case can be assigned to. */
export const staffMember = z.object({ id, name: z.string(), role: z.enum(ROLES) });
export type StaffMember = z.infer<typeof staffMember>;
export const staffListResponse = z.object({ users: z.array(staffMember) });
