// The language a tenant reads Dewline in (PUT /api/me/language). Only languages with complete text:
// the pseudo-locales are for tests and come from the URL, never from here.
import { z } from "zod";

export const STORED_LANGUAGES = ["en", "cy"] as const;
export type StoredLanguage = (typeof STORED_LANGUAGES)[number];

export const myLanguageSchema = z.object({
  language: z.enum(STORED_LANGUAGES, { error: 'Choose "en" (English) or "cy" (Cymraeg).' }),
});
export type MyLanguageInput = z.infer<typeof myLanguageSchema>;
