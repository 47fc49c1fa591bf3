import { z } from "zod";
import { TENANCY_FIELDS, tenancyMapping } from "../../../src/lib/contracts/tenancy-import.js";

/** The multipart fields beside the file: the admin's corrected mapping, as JSON (optional). */
export const tenancyImportFieldsSchema = z.object({
  mapping: z
    .string()
    .optional()
    .transform((s, ctx) => {
      if (s === undefined || s === "") return undefined;
      let value: unknown;
      try {
        value = JSON.parse(s);
      } catch {
        ctx.addIssue({ code: "custom", message: "mapping must be JSON." });
        return z.NEVER;
      }
      const full = Object.fromEntries(TENANCY_FIELDS.map((f) => [f, null]));
      const parsed = tenancyMapping.safeParse({ ...full, ...(value as object) });
      if (!parsed.success) {
        ctx.addIssue({ code: "custom", message: "mapping: each field is a column number from 0, or null." });
        return z.NEVER;
      }
      return parsed.data;
    }),
});
