// The report schema (src/lib/schemas/case-report.ts) is shared with the server and speaks English; the
// form says the same thing in the tenant's language. The three checked answers have one rule each (and
// the description a length limit), so their message follows from the field alone, whoever found it.
import type { TFunction } from "i18next";

const DESCRIPTION_MAX = 4000;

export function fieldErrorText(
  t: TFunction,
  field: string,
  error: { type?: string | number; message?: string } | undefined,
): string | undefined {
  if (!error) return undefined;
  switch (field) {
    case "description":
      return error.type === "too_big" || /4,000/.test(error.message ?? "")
        ? t("report:errors.describeTooLong", { max: DESCRIPTION_MAX })
        : t("report:errors.describe");
    case "locations":
      return t("report:errors.locations");
    case "observations":
      return t("report:errors.observations");
    default:
      return error.message;
  }
}
