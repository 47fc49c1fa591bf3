// The pseudo-locale check: with ?lang=en-XA every translated string reads ⟦Ţĥíš~~~⟧, so Latin letters
// outside the brackets are text that skipped translation, unless the element says it is data
// (translate="no": addresses, names, references, what people typed).
import type { Page } from "playwright-core";

/**
 * Visible text in `main`, `header`, `nav` and open dialogs with Latin letters outside ⟦ ⟧ and not
 * inside an element marked translate="no" (nor inside `except`, a selector for known gaps). Pure numbers and
 * punctuation are ignored.
 */
export async function findUntranslated(page: Page, { except }: { except?: string } = {}): Promise<string[]> {
  return page.evaluate((except) => {
    const roots = Array.from(document.querySelectorAll("main, header, nav, dialog[open], [role='dialog']"));
    const found = new Set<string>();
    const visible = (el: Element) => {
      const box = (el as HTMLElement).getBoundingClientRect();
      const style = getComputedStyle(el);
      if (style.visibility === "hidden" || style.display === "none") return false;
      // Screen-reader-only text is text too: it is read out, so it must be translated.
      return box.width > 0 || box.height > 0 || style.position === "absolute";
    };
    for (const root of roots) {
      const walker = document.createTreeWalker(root, NodeFilter.SHOW_TEXT);
      for (let node = walker.nextNode(); node; node = walker.nextNode()) {
        const parent = node.parentElement;
        if (!parent || parent.closest("[translate='no'], script, style, svg")) continue;
        if (except && parent.closest(except)) continue;
        if (!visible(parent)) continue;
        found.add(node.textContent ?? "");
      }
    }
    // Joined per text node; the brackets may open in one node and close in another (a link inside a sentence).
    const untranslated: string[] = [];
    for (const text of found) {
      const outside = text
        .replace(/⟦[^⟧]*⟧/g, "")
        .replace(/⟦[^⟧]*$/g, "")
        .replace(/^[^⟦]*⟧/g, "");
      if (/[A-Za-z]/.test(outside)) untranslated.push(text.trim());
    }
    return untranslated;
  }, except ?? null);
}
