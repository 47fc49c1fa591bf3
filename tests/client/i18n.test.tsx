import { afterEach, describe, expect, it } from "vitest";
import { i18n, showLanguage } from "@/lib/i18n/i18n";
import { lngFromTag } from "@/lib/i18n/languages";

// The language machinery itself; each feature's own tests check its screens in Welsh.
describe("languages", () => {
  afterEach(async () => {
    await showLanguage("en");
  });

  it("picks the language from a stored or browser tag, English for one Dewline has no text for", () => {
    expect(lngFromTag("cy")).toBe("cy");
    expect(lngFromTag("cy-GB")).toBe("cy");
    expect(lngFromTag("en")).toBe("en-GB");
    expect(lngFromTag("pl")).toBe("en-GB");
    expect(lngFromTag(null)).toBe("en-GB");
  });

  it("switches to Welsh, loading its text, and sets the page's language", async () => {
    expect(i18n.t("common:language.label")).toBe("Language");
    await showLanguage("cy");
    expect(i18n.t("common:language.label")).toBe("Iaith");
    expect(document.documentElement.lang).toBe("cy");
    expect(document.documentElement.dir).toBe("ltr");
  });

  it("formats ICU plurals with Welsh's own categories (CLDR: zero, one, two, few, many, other)", async () => {
    await showLanguage("cy");
    const message = "{n, plural, zero {# llun} one {# llun} two {# lun} few {# llun} many {# llun} other {# llun}}";
    i18n.addResource("cy", "common", "test.photos", message);
    // Welsh mutates "llun" after two (dau lun): the "two" form is chosen only for 2.
    expect(i18n.t("common:test.photos", { n: 2 })).toBe("2 lun");
    expect(i18n.t("common:test.photos", { n: 3 })).toBe("3 llun");
  });

  it("turns the page right to left in the pseudo-RTL language and marks every translated string", async () => {
    await showLanguage("ar-XB");
    expect(document.documentElement.dir).toBe("rtl");
    const text = i18n.t("common:language.label");
    expect(text.startsWith("⟦\u202e")).toBe(true);
    expect(text).toContain("Ļáñĝúáĝé");
  });
});
