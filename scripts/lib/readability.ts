// Reading age of tenant-facing text, by the Flesch-Kincaid grade level (Kincaid, Fishburne, Rogers and
// Chissom 1975, "Derivation of new readability formulas for Navy enlisted personnel", Research Branch
// Report 8-75, US Naval Technical Training Command):
//   grade = 0.39 × (words / sentences) + 11.8 × (syllables / words) − 15.59
// The grade is a US school grade; the reading age is grade + 5 (a US grade 1 child is about six; common
// practice, no source). Words, syllables and sentences are counted by text-readability 1.1.1; the formula
// is applied here to the summed counts, so a group of short messages is weighed by its words (the
// package's own fleschKincaidGrade rounds both averages to one decimal first, up to ±0.6 of a grade).
import { IntlMessageFormat } from "intl-messageformat";
import readability from "text-readability";

export interface Counts {
  words: number;
  sentences: number;
  syllables: number;
}

export interface Measured extends Counts {
  /** Flesch-Kincaid grade; NaN when there are no words. */
  grade: number;
  /** grade + 5. */
  readingAge: number;
}

/** Links are not read as words: an address is followed, not read. */
const withoutLinks = (text: string) => text.replace(/\bhttps?:\/\/\S+/g, " ");

/**
 * The counts of one text. Each non-empty line is counted on its own (a greeting, a list item or a label
 * is read as a unit of its own, even without a full stop); text-readability counts at least one
 * sentence per line.
 */
export function countText(text: string): Counts {
  const total: Counts = { words: 0, sentences: 0, syllables: 0 };
  for (const line of withoutLinks(text).split(/\r?\n/)) {
    const words = line.trim() ? readability.lexiconCount(line) : 0;
    if (!words) continue;
    total.words += words;
    total.sentences += readability.sentenceCount(line);
    total.syllables += readability.syllableCount(line);
  }
  return total;
}

export function fkGrade({ words, sentences, syllables }: Counts): number {
  if (!words || !sentences) return Number.NaN;
  return 0.39 * (words / sentences) + 11.8 * (syllables / words) - 15.59;
}

export function measure(counts: Counts): Measured {
  const grade = fkGrade(counts);
  return { ...counts, grade, readingAge: grade + 5 };
}

export const measureText = (text: string): Measured => measure(countText(text));

export const sumCounts = (all: readonly Counts[]): Counts =>
  all.reduce(
    (a, c) => ({ words: a.words + c.words, sentences: a.sentences + c.sentences, syllables: a.syllables + c.syllables }),
    {
      words: 0,
      sentences: 0,
      syllables: 0,
    },
  );

// intl-messageformat's AST node types (its TYPE enum), read without importing the parser package.
interface Node {
  type: number;
  value?: string;
  options?: Record<string, { value: Node[] }>;
  children?: Node[];
}
const SAMPLE_NUMBER = "3";

/**
 * An ICU message as a reader sees it, with sample values: a placeholder becomes a short name ("Sam"), a
 * number 3, a date "5 May 2026", a plural or select its "other" form, a tag its contents.
 */
export function icuToText(message: string): string {
  const ast = new IntlMessageFormat(message, "en-GB", undefined, { ignoreTag: false }).getAst() as unknown as Node[];
  const walk = (nodes: Node[], pound: string): string =>
    nodes
      .map((n) => {
        switch (n.type) {
          case 0: // literal
            return n.value ?? "";
          case 1: // argument
            return "Sam";
          case 2: // number
            return SAMPLE_NUMBER;
          case 3: // date
            return "5 May 2026";
          case 4: // time
            return "10:30";
          case 5: // select
          case 6: {
            // plural
            const options = n.options ?? {};
            const chosen = options.other ?? Object.values(options)[0];
            return chosen ? walk(chosen.value, SAMPLE_NUMBER) : "";
          }
          case 7: // the plural's "#"
            return pound;
          case 8: // tag
            return walk(n.children ?? [], pound);
          default:
            return "";
        }
      })
      .join("");
  return walk(ast, SAMPLE_NUMBER);
}

/** Every string of a nested message file, by its dotted key. */
export function flattenMessages(tree: unknown, prefix = ""): [string, string][] {
  if (typeof tree === "string") return [[prefix, tree]];
  if (!tree || typeof tree !== "object") return [];
  return Object.entries(tree as Record<string, unknown>).flatMap(([k, v]) => flattenMessages(v, prefix ? `${prefix}.${k}` : k));
}

export interface Message {
  key: string;
  text: string;
}

export interface SourceReport extends Measured {
  source: string;
  messages: number;
  /** The five messages of highest grade (of at least five words, so a label is never "hard"). */
  hardest: (Measured & { key: string })[];
}

export function measureSource(source: string, messages: readonly Message[]): SourceReport {
  const each = messages.map((m) => ({ key: m.key, ...measureText(m.text) }));
  const hardest = each
    .filter((m) => m.words >= 5)
    .sort((a, b) => b.grade - a.grade)
    .slice(0, 5);
  return { source, messages: messages.length, ...measure(sumCounts(each)), hardest };
}
