// What staff are told about a tenant's language (staff screens are English): nothing when it is
// English, "Prefers Welsh (Cymraeg)" when it is another, "Language not known" when nobody has said.
const NAMES: Record<string, string> = { cy: "Welsh (Cymraeg)" };

export function languagePreferenceWords(stored: string | null): string | null {
  if (!stored) return "Language not known";
  const primary = stored.toLowerCase().split("-")[0]!;
  if (primary === "en") return null;
  return `Prefers ${NAMES[primary] ?? `the language "${stored}"`}`;
}
