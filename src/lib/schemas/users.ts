// What an admin may change on an account (PATCH /api/users/:id), shared by the server and the edit form.
import { z } from "zod";
import { ROLES } from "../roles.js";

export const personNameSchema = z
  .string({ error: "Enter the person's name." })
  .trim()
  .min(1, "Enter the person's name.")
  .max(190, "A name can be at most 190 characters.");

export const userUpdateSchema = z
  .object({
    name: personNameSchema.optional(),
    role: z.enum(ROLES, { error: `role must be one of ${ROLES.join(", ")}.` }).optional(),
    status: z.enum(["active", "disabled"], { error: "status must be active or disabled." }).optional(),
  })
  .strict()
  .refine((v) => v.name !== undefined || v.role !== undefined || v.status !== undefined, {
    message: "Send at least one of name, role or status.",
  });
export type UserUpdateInput = z.infer<typeof userUpdateSchema>;
