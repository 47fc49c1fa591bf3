// UK mobile numbers, as tenants type them: "07700 900123", "+44 7700 900123", "(0)7700-900123".
// Mobile numbers in the UK begin 07 and have 11 digits (Ofcom's national numbering plan, from memory);
// 07624 (Isle of Man) and the 070 personal-number range are not told apart here.

/** Why a number was not accepted, in plain words; null when it is fine. */
export function ukMobileProblem(input: string): string | null {
  const digits = input.replace(/[\s().-]/g, "");
  if (!digits) return "Enter your mobile number.";
  if (!/^\+?\d+$/.test(digits)) return "Use only numbers, like 07700 900123.";
  const national = digits.replace(/^\+?44(?:0)?/, "0");
  if (!national.startsWith("07")) return "Enter a UK mobile number. It starts with 07, like 07700 900123.";
  if (national.length !== 11) return "A UK mobile number has 11 numbers, like 07700 900123.";
  return null;
}

/** The number in one form (+447…), or null when it is not a UK mobile number. */
export function normaliseUkMobile(input: string): string | null {
  if (ukMobileProblem(input) !== null) return null;
  const national = input.replace(/[\s().-]/g, "").replace(/^\+?44(?:0)?/, "0");
  return `+44${national.slice(1)}`;
}
