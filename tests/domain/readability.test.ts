// The reading-age measurement (scripts/lib/readability.ts) on two texts counted by hand, and the way it
// reads ICU messages. The formula: Flesch-Kincaid grade (Kincaid, Fishburne, Rogers and Chissom 1975,
// US Naval Technical Training Command, Research Branch Report 8-75)
//   grade = 0.39 × words/sentences + 11.8 × syllables/words − 15.59, reading age = grade + 5.
import { describe, expect, it } from "vitest";
import { icuToText, measureSource, measureText } from "../../scripts/lib/readability.js";

describe("Flesch-Kincaid reading age", () => {
  it("an easy text: 11 words of one syllable but 'af-ter', in two sentences", () => {
    // The, cat, sat, on, the, mat / The, dog, ran, af-ter, it: 11 words, 12 syllables, 2 sentences.
    // 0.39 × 11/2 + 11.8 × 12/11 − 15.59 = 2.145 + 12.873 − 15.59 = −0.572 → reading age 4.43.
    const m = measureText("The cat sat on the mat. The dog ran after it.");
    expect({ words: m.words, syllables: m.syllables, sentences: m.sentences }).toEqual({
      words: 11,
      syllables: 12,
      sentences: 2,
    });
    expect(m.grade).toBeCloseTo(-0.572, 2);
    expect(m.readingAge).toBeCloseTo(4.428, 2);
  });

  it("a harder text: long words about condensation", () => {
    // Con-den-sa-tion (4) ap-pears (2) when (1) hu-mid (2) air (1) meets (1) a (1) col-der (2) sur-face (2);
    // Ven-ti-la-tion (4) re-du-ces (3) mois-ture (2): 12 words, 25 syllables, 2 sentences.
    // 0.39 × 12/2 + 11.8 × 25/12 − 15.59 = 2.34 + 24.583 − 15.59 = 11.333 → reading age 16.33.
    const m = measureText("Condensation appears when humid air meets a colder surface. Ventilation reduces moisture.");
    expect({ words: m.words, syllables: m.syllables, sentences: m.sentences }).toEqual({
      words: 12,
      syllables: 25,
      sentences: 2,
    });
    expect(m.grade).toBeCloseTo(11.333, 2);
    expect(m.readingAge).toBeCloseTo(16.333, 2);
  });

  it("leaves links out and reads each line as its own unit", () => {
    const m = measureText("Read it here:\nhttps://dewline.example/cases/42\nThank you.");
    expect({ words: m.words, sentences: m.sentences }).toEqual({ words: 5, sentences: 2 });
  });

  it("a group is measured on its summed counts, and its hardest messages come first", () => {
    const r = measureSource("sample", [
      { key: "easy", text: "The cat sat on the mat. The dog ran after it." },
      { key: "hard", text: "Condensation appears when humid air meets a colder surface. Ventilation reduces moisture." },
      { key: "label", text: "Next" },
    ]);
    // 24 words, 38 syllables, 5 sentences: 0.39 × 24/5 + 11.8 × 38/24 − 15.59 = 1.872 + 18.683 − 15.59 = 4.965.
    expect({ messages: r.messages, words: r.words, sentences: r.sentences, syllables: r.syllables }).toEqual({
      messages: 3,
      words: 24,
      sentences: 5,
      syllables: 38,
    });
    expect(r.grade).toBeCloseTo(4.965, 2);
    expect(r.hardest.map((h) => h.key)).toEqual(["hard", "easy"]);
  });
});

describe("ICU messages as a reader sees them", () => {
  it("takes the plural's other form, fills placeholders and keeps a tag's words", () => {
    expect(icuToText("{count, plural, one {# photo} other {# photos}} from {name} on {when, date, medium}")).toBe(
      "3 photos from Sam on 5 May 2026",
    );
    expect(icuToText("Read <strong>the advice</strong> first.")).toBe("Read the advice first.");
    expect(icuToText("{who, select, tenant {You} other {They}} wrote")).toBe("They wrote");
  });
});
