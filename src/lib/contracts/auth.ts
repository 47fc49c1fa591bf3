import { z } from "zod";
import { ROLES } from "../roles.js";
import { id, instant, messageResponse } from "./common.js";

/**
 * The signed-in user (GET /api/auth/me; `user` of POST /api/auth/login). `language` is the stored
 * preferred language ("en", "cy", or a tag a tenancy file gave), null when nobody has said.
 */
export const meResponse = z.object({
  id,
  email: z.string(),
  name: z.string(),
  role: z.enum(ROLES),
  organisationId: id,
  language: z.string().nullable(),
});
export type Me = z.infer<typeof meResponse>;

export const csrfResponse = z.object({ csrfToken: z.string() });
export const loginResponse = z.object({ user: meResponse, csrfToken: z.string() });
export type LoginResponse = z.infer<typeof loginResponse>;

/**
 * POST /api/auth/invitations: the same whether or not the address already has an account with another
 * landlord (that must not be told), so it names no account.
 */
export const invitationSentResponse = z.object({ expiresAt: instant });
export type InvitationSent = z.infer<typeof invitationSentResponse>;

/** POST /api/auth/invitations/:userId/resend. */
export const invitationCreatedResponse = z.object({ userId: id, expiresAt: instant });
export type InvitationCreated = z.infer<typeof invitationCreatedResponse>;

/** GET /api/auth/invitations/:token. */
export const invitationDescriptionResponse = z.object({ email: z.string(), name: z.string(), organisationName: z.string() });
export type InvitationDescription = z.infer<typeof invitationDescriptionResponse>;

/** POST /api/auth/password-reset (202, the same whatever the address). */
export const passwordResetRequestedResponse = messageResponse;

/** POST /api/auth/sign-in-unlock/request (202, the same whatever the address). */
export const signInUnlockRequestedResponse = messageResponse;

/** PUT /api/me/language: the tenant's language as now stored. */
export const myLanguageResponse = z.object({ language: z.string() });
export type MyLanguage = z.infer<typeof myLanguageResponse>;
