import type { Request } from "express";
import enErrors from "../locales/en-GB/errors.js";
import type { ErrorMessageId, Phrase } from "./errors.js";
import { messageLanguage, translator, type MessageLanguage, type Translate } from "./i18n.js";

/**
 * Error messages in the tenant's language. Services throw with English text, as always; the error handler
 * asks `errorLanguage` which language the person reads and, when it is not English, `translatedError`
 * puts each message into it from server/locales/<lng>/errors.ts. A message is found by its English text
 * (a catalogue text without placeholders) or by the phrases its thrower named (AppError.saying); a message
 * not in the catalogue stays in English rather than be guessed at. English answers are never touched.
 */

const english = translator("en-GB", "errors");

/** The catalogue's texts without placeholders, by their English: how a thrown English message finds its id. */
const BY_ENGLISH = new Map<string, ErrorMessageId>(
  (Object.keys(enErrors) as ErrorMessageId[]).filter((id) => !enErrors[id].includes("{")).map((id) => [english(id), id]),
);

/** Every message id of the catalogue (tests check each has its text in every language). */
export const ERROR_MESSAGE_IDS = Object.keys(enErrors) as ErrorMessageId[];

/** The languages with error texts, by the primary subtag an Accept-Language header names them with. */
const PRIMARY_WITH_TEXT = new Set(["en", "cy"]);

/**
 * The best language with text among an Accept-Language header's ("cy, en-GB;q=0.8"), or undefined.
 * The tenant pages' client sends the language the tenant chose; a browser sends its own otherwise.
 */
function fromAcceptLanguage(header: string | undefined): string | undefined {
  let best: string | undefined;
  let bestQ = 0;
  for (const part of (header ?? "").split(",")) {
    const [tag = "", ...params] = part.split(";").map((p) => p.trim());
    if (!PRIMARY_WITH_TEXT.has(tag.toLowerCase().split("-")[0] ?? "")) continue;
    const q = params.find((p) => p.startsWith("q="));
    const weight = q === undefined ? 1 : Number(q.slice(2));
    if (Number.isFinite(weight) && weight > bestQ) {
      best = tag;
      bestQ = weight;
    }
  }
  return best;
}

/** What the error handler sees of a signed-in user (the session's cached account; no extra read). */
interface SignedIn {
  role: string;
  preferredLanguage?: string | null;
}

/**
 * The language a request's error messages are written in: staff always English; a tenant the language
 * stored on their account (from the session's cached account, so no row is read for it); signed out, or a
 * tenant who never chose, the language the request asks for in Accept-Language.
 */
export function errorLanguage(req: Request): MessageLanguage {
  const user = req.user as SignedIn | undefined;
  if (user && user.role !== "tenant") return "en-GB";
  if (user?.preferredLanguage) return messageLanguage(user.preferredLanguage);
  return messageLanguage(fromAcceptLanguage(req.get("accept-language")));
}

const capitalised = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

/** One phrase in the language, or null when the catalogue does not have it. */
function phraseIn(t: Translate, phrase: Phrase): string | null {
  if (typeof phrase !== "string") return t(phrase.id, phrase.values);
  const id = BY_ENGLISH.get(phrase);
  if (id) return t(id);
  // A validation message naming its field first ("description: Tell us in a few words what you see."):
  // the field's name is the request's own word and stays; the rest is a catalogue text.
  const named = /^([A-Za-z][\w.[\]-]*): (.+)$/s.exec(phrase);
  if (named) {
    const rest = BY_ENGLISH.get(named[2]!) ?? BY_ENGLISH.get(capitalised(named[2]!));
    if (rest) return `${named[1]}: ${t(rest)}`;
  }
  return null;
}

/** A whole message: every phrase must be in the catalogue, or the English stands (never half and half). */
function messageIn(t: Translate, message: string, phrases: readonly Phrase[] | undefined): string {
  const parts = (phrases ?? [message]).map((p) => phraseIn(t, p));
  return parts.every((p): p is string => p !== null) ? parts.join(" ") : message;
}

/** The details' messages (field errors, refused files) in the language; anything else as it was. */
function detailsIn(t: Translate, details: unknown): unknown {
  const each = (item: unknown, key: "message" | "reason") => {
    if (typeof item !== "object" || item === null) return item;
    const text = (item as Record<string, unknown>)[key];
    return typeof text === "string" ? { ...item, [key]: messageIn(t, text, undefined) } : item;
  };
  if (Array.isArray(details)) return details.map((d) => each(d, "message"));
  const refused = (details as { refused?: unknown } | null | undefined)?.refused;
  if (Array.isArray(refused)) return { ...(details as object), refused: refused.map((r) => each(r, "reason")) };
  return details;
}

/** An error's message and details in the language (English: exactly as thrown). */
export function translatedError(
  language: MessageLanguage,
  error: { message: string; details?: unknown; phrases?: readonly Phrase[] },
): { message: string; details?: unknown } {
  if (language === "en-GB") return { message: error.message, details: error.details };
  const t = translator(language, "errors");
  return { message: messageIn(t, error.message, error.phrases), details: detailsIn(t, error.details) };
}
