import { z } from "zod";
import { ROLES } from "../../../src/lib/roles.js";
import { idParam } from "../../lib/validation.js";

export const emailSchema = z
  .string({ error: "Enter an e-mail address." })
  .trim()
  .toLowerCase()
  .max(190, "An e-mail address can be at most 190 characters.")
  .pipe(z.email({ error: "Enter a valid e-mail address, like name@example.org." }));

export const newPasswordSchema = z
  .string({ error: "Enter a password." })
  .min(10, "Use at least 10 characters.")
  .max(200, "Use at most 200 characters.");

export const loginSchema = z.object({
  email: emailSchema,
  password: z.string({ error: "Enter your password." }).min(1, "Enter your password.").max(200),
});

const tokenSchema = z.string({ error: "The link is missing its token." }).regex(/^[A-Za-z0-9_-]{43}$/, "This link is not valid.");

export const tokenParamsSchema = z.object({ token: tokenSchema });

export const userIdParamsSchema = z.object({
  userId: idParam("userId"),
});

export const acceptInvitationSchema = z.object({ token: tokenSchema, password: newPasswordSchema });

export const passwordResetRequestSchema = z.object({ email: emailSchema });

export const signInUnlockSchema = z.object({ token: tokenSchema });

export const signInUnlockRequestSchema = z.object({ email: emailSchema });

export const passwordResetSchema = z.object({ token: tokenSchema, password: newPasswordSchema });

export const invitationSchema = z
  .object({
    email: emailSchema,
    name: z.string({ error: "Enter the person's name." }).trim().min(1, "Enter the person's name.").max(190),
    role: z.enum(ROLES, { error: `Role must be one of ${ROLES.join(", ")}.` }),
    propertyId: z.coerce.number().int().positive().optional(),
    householdNotes: z.string().trim().max(2000).optional(),
  })
  .refine((v) => v.role !== "tenant" || v.propertyId !== undefined, {
    path: ["propertyId"],
    message: "A tenant's invitation needs the home they live in.",
  });

export type InvitationInput = z.infer<typeof invitationSchema>;
