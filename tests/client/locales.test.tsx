// Every namespace's text: the same keys in every language, and every message a valid ICU message in
// its language (parsed as i18next-icu does at run time, tags left as text for <Trans>). Guards every
// helper's files under src/locales, not only the shell's.
import { readdirSync, readFileSync } from "node:fs";
import { join } from "node:path";
import { IntlMessageFormat } from "intl-messageformat";
import { describe, expect, it } from "vitest";

const ROOT = join(process.cwd(), "src/locales");
const languages = readdirSync(ROOT).filter((d) => !d.startsWith("."));
const namespacesOf = (lng: string) =>
  readdirSync(join(ROOT, lng))
    .filter((f) => f.endsWith(".json"))
    .map((f) => f.replace(/\.json$/, ""));

type Tree = { [key: string]: string | Tree };
const read = (lng: string, ns: string): Tree => JSON.parse(readFileSync(join(ROOT, lng, `${ns}.json`), "utf8")) as Tree;

function flatten(tree: Tree, prefix = ""): Map<string, string> {
  const out = new Map<string, string>();
  for (const [key, value] of Object.entries(tree)) {
    const path = prefix ? `${prefix}.${key}` : key;
    if (typeof value === "string") out.set(path, value);
    else for (const [k, v] of flatten(value, path)) out.set(k, v);
  }
  return out;
}

describe("the text of every language", () => {
  it("has English and at least one other language", () => {
    expect(languages).toContain("en-GB");
    expect(languages).toContain("cy");
  });

  const namespaces = [...new Set(languages.flatMap(namespacesOf))].sort();

  for (const ns of namespaces) {
    it(`${ns}: every language has the same keys`, () => {
      const english = [...flatten(read("en-GB", ns)).keys()].sort();
      for (const lng of languages) {
        expect(namespacesOf(lng), `${lng} has no ${ns}.json`).toContain(ns);
        const keys = [...flatten(read(lng, ns)).keys()].sort();
        expect({ lng, missing: english.filter((k) => !keys.includes(k)) }).toEqual({ lng, missing: [] });
        expect({ lng, extra: keys.filter((k) => !english.includes(k)) }).toEqual({ lng, extra: [] });
      }
    });

    it(`${ns}: every message parses as ICU in its language`, () => {
      const problems: string[] = [];
      for (const lng of languages) {
        if (!namespacesOf(lng).includes(ns)) continue;
        for (const [key, message] of flatten(read(lng, ns))) {
          try {
            new IntlMessageFormat(message, lng, undefined, { ignoreTag: true });
          } catch (error) {
            problems.push(`${lng}/${ns}.json ${key}: ${(error as Error).message}`);
          }
        }
      }
      expect(problems).toEqual([]);
    });
  }
});
