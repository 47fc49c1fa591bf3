import { z } from "zod";
import type { FieldErrorDetail } from "../../src/lib/contracts/common.js";
import { ValidationError } from "./errors.js";

/** Parses one part of a request with a zod schema, or throws a 400 naming each bad field. */
export function parse<S extends z.ZodType>(schema: S, value: unknown, part: "body" | "query" | "params" = "body"): z.infer<S> {
  const result = schema.safeParse(value ?? {});
  if (result.success) return result.data;
  const details: FieldErrorDetail[] = result.error.issues.map((issue) => ({
    field: issue.path.join(".") || part,
    message: issue.message,
  }));
  const first = details[0];
  const message = first ? `${first.field}: ${first.message}` : `Invalid request ${part}.`;
  throw new ValidationError(message, details);
}

/** The largest id an INT UNSIGNED column holds. */
export const MAX_ID = 4_294_967_295;

/**
 * An id in a path or query string, in its one canonical form: decimal digits, no sign, no leading
 * zero, no fraction or exponent, within INT UNSIGNED. `z.coerce.number()` would also read "0x1b",
 * "27.0", "2.7e1" or " 27" as 27, so one case would answer to many addresses.
 */
export const idParam = (label = "The id") =>
  z
    .string({ error: `${label} must be a positive whole number.` })
    .regex(/^[1-9][0-9]{0,9}$/, `${label} must be a positive whole number written in digits, like 27.`)
    .transform(Number)
    .refine((n) => n <= MAX_ID, `${label} is too large.`);
