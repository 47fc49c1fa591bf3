// Building blocks of the API's response shapes (the contract shared by server and client).
// Relative imports with .js only: the server (NodeNext) compiles these files too.
import { z } from "zod";

/** An instant as the server writes it: `Date.toISOString()`, UTC with a Z. */
export const instant = z.iso.datetime({ offset: false });
/** A calendar date, YYYY-MM-DD. */
export const calendarDate = z.iso.date();
export const id = z.number().int().positive();
export const idName = z.object({ id, name: z.string() });

/** A page of a server-side table (`?page=&pageSize=`). */
export const pageOf = <T extends z.ZodType>(item: T) =>
  z.object({
    items: z.array(item),
    total: z.number().int().min(0),
    page: z.number().int().min(1),
    pageSize: z.number().int().min(1),
  });

/** One field's problem, as a 400 `validation_failed` lists them in `details` (server/lib/validation.ts). */
export const fieldErrorDetail = z.object({ field: z.string(), message: z.string() });
export type FieldErrorDetail = z.infer<typeof fieldErrorDetail>;

/** The one error shape every failing route answers with (server/middleware/error-handler.ts). */
export const errorResponse = z.object({
  error: z.object({ code: z.string(), message: z.string(), details: z.unknown().optional() }),
});
export type ErrorResponse = z.infer<typeof errorResponse>;

/** A reply with no body (204) or a plain acknowledgement. */
export const noContent = z.undefined();
export const okResponse = z.object({ ok: z.literal(true) });
export const messageResponse = z.object({ message: z.string() });
