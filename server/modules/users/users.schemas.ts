import { z } from "zod";
import { ROLES } from "./user.entity.js";
import { exportFormatSchema } from "../../../src/lib/contracts/export-query.js";

export const userListQuerySchema = z.object({
  role: z.enum(ROLES).optional(),
  q: z.string().trim().max(100).optional(),
  page: z.coerce.number().int().min(1).default(1),
  pageSize: z.coerce.number().int().min(1).max(200, "pageSize can be at most 200.").default(50),
});
export type UserListQuery = z.infer<typeof userListQuerySchema>;

/** GET /api/users/export: the list's filters (every page) and the format. */
export const userExportQuerySchema = userListQuerySchema
  .omit({ page: true, pageSize: true })
  .extend({ format: exportFormatSchema });

export { userUpdateSchema, type UserUpdateInput } from "../../../src/lib/schemas/users.js";
