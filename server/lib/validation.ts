import type { z } from "zod";
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
