import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { i18n, showLanguage } from "@/lib/i18n/i18n";
import { rememberChoice } from "@/lib/i18n/choice";
import type { Lng } from "@/lib/i18n/languages";

/** The language chosen on this device (as the switch does), so the signed-in shell shows it too. */
async function choose(lng: Lng): Promise<void> {
  rememberChoice(lng);
  await showLanguage(lng);
}
import { PSEUDO_CLOSE, PSEUDO_OPEN } from "@/lib/i18n/pseudo";
import { makeProperty, mockApi, unauthenticated, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

// The report form and the calculator in Welsh, and in the pseudo-locale en-XA, where any English word
// left on the page is a string that skipped translation.

const myHome = {
  tenancy: { id: 4, startDate: "2021-04-12", endDate: null },
  property: {
    ...makeProperty(5, { addressLine1: "1 Heol y Bont", addressLine2: null, estate: "Ystad y Felin", block: null }),
    rooms: [
      { id: 1, name: "Living room", kind: "living" },
      { id: 2, name: "Bedroom 1", kind: "bedroom" },
    ],
  },
};

function tenantApi() {
  return mockApi({
    "GET /api/auth/me": { body: users.tenant },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/me/home": { body: myHome },
    "GET /api/me/cases": { body: { items: [] } },
  });
}

/**
 * Text nodes under `root` with a Latin letter outside ⟦ ⟧ and outside elements marked translate="no":
 * English that did not pass through translation.
 */
function untranslated(root: Element): string[] {
  const found: string[] = [];
  const walker = document.createTreeWalker(root, NodeFilter.SHOW_TEXT);
  for (let node = walker.nextNode(); node; node = walker.nextNode()) {
    const text = node.textContent ?? "";
    if (node.parentElement?.closest('[translate="no"], script, style, title')) continue;
    const outside = text.replace(new RegExp(`${PSEUDO_OPEN}[^${PSEUDO_CLOSE}]*${PSEUDO_CLOSE}`, "g"), "");
    if (/[A-Za-z]{2,}/.test(outside)) found.push(text.trim());
  }
  return found;
}

describe("the report form in other languages", () => {
  beforeEach(() => {
    clearCsrfToken();
    window.localStorage.clear();
  });
  afterEach(async () => {
    window.localStorage.clear();
    await showLanguage("en");
  });

  it("asks its questions in Welsh, and says what is missing in Welsh", async () => {
    await choose("cy");
    tenantApi();
    const user = userEvent.setup();
    renderApp("/report");
    expect(await screen.findByRole("heading", { level: 1, name: "Rhoi gwybod am leithder neu lwydni" })).toBeInTheDocument();
    expect(await screen.findByRole("heading", { level: 2, name: /Cam 1 o 6/ })).toBeInTheDocument();
    expect(screen.getByLabelText(/Beth allwch chi ei weld/)).toBeInTheDocument();
    expect(screen.getByRole("group", { name: "Ble mae e?" })).toBeInTheDocument();
    expect(screen.getByRole("checkbox", { name: "Ffenest neu ffrâm ffenest" })).toBeInTheDocument();
    // The safety cautions come with the form, with the same warnings.
    expect(screen.getByRole("heading", { name: "Cadw'n ddiogel" })).toBeInTheDocument();
    expect(screen.getByText(/carbon monocsid/)).toBeInTheDocument();

    await user.click(screen.getByRole("button", { name: "Nesaf" }));
    const where = screen.getByRole("group", { name: "Ble mae e?" });
    expect(within(where).getByText("Dewiswch o leiaf un lle.")).toBeInTheDocument();
    expect(screen.getByText("Dywedwch wrthym mewn ychydig eiriau beth rydych chi'n ei weld.")).toBeInTheDocument();
    // Room names are the landlord's data: shown as they are, and marked so.
    expect(screen.getByText("Bedroom 1").closest('[translate="no"]')).not.toBeNull();
  });

  it("counts photos and readings with Welsh plurals", async () => {
    await choose("cy");
    expect(i18n.t("report:check.photoCount", { count: 1 })).toBe("1 llun");
    expect(i18n.t("report:check.photoCount", { count: 2 })).toBe("2 lun");
    expect(i18n.t("report:check.readingCount", { count: 2 })).toBe("2 ddarlleniad");
    expect(i18n.t("report:check.readingCount", { count: 3 })).toBe("3 darlleniad");
  });

  it("leaves no English in the form's first steps in the pseudo-locale", async () => {
    await choose("en-XA");
    tenantApi();
    const user = userEvent.setup();
    renderApp("/report");
    const form = await screen.findByRole("form");
    expect(untranslated(form)).toEqual([]);
    // The error messages too.
    await user.click(within(form).getAllByRole("button").at(-1)!);
    expect(untranslated(form)).toEqual([]);
    const main = document.querySelector("main")!;
    expect(untranslated(main)).toEqual([]);
  });
});

describe("the calculator in other languages", () => {
  afterEach(async () => {
    window.localStorage.clear();
    await showLanguage("en");
  });

  it("labels its fields, says its checks and shows its result in Welsh", async () => {
    await choose("cy");
    mockApi({ "GET /api/auth/me": unauthenticated });
    const user = userEvent.setup();
    renderApp("/calculator");
    expect(
      await screen.findByRole("heading", { level: 1, name: "Cyfrifiannell pwynt gwlith a lleithder arwyneb" }),
    ).toBeInTheDocument();
    await user.type(screen.getByLabelText(/^Tymheredd yr ystafell/), "19");
    await user.type(screen.getByLabelText(/^Lleithder cymharol/), "178");
    expect(screen.getByLabelText(/^Lleithder cymharol/)).toHaveAccessibleDescription(
      expect.stringContaining("Lleithder cymharol: rhaid iddo fod 100 % ar y mwyaf."),
    );
    await user.clear(screen.getByLabelText(/^Lleithder cymharol/));
    await user.type(screen.getByLabelText(/^Lleithder cymharol/), "78");
    await user.type(screen.getByLabelText(/^Tymheredd yr arwyneb/), "9");
    const result = screen.getByRole("region", { name: "Canlyniad" });
    expect(await within(result).findByText("Anwedd")).toBeInTheDocument();
    // Source: the English test's Magnus form figure (tests/client/calculator.test.tsx), 15.1 °C.
    expect(within(result).getByText("Pwynt gwlith", { selector: "dt" }).nextElementSibling).toHaveTextContent("15.1 °C");
  });

  it("leaves no English on the empty calculator in the pseudo-locale", async () => {
    await choose("en-XA");
    mockApi({ "GET /api/auth/me": unauthenticated });
    renderApp("/calculator");
    await screen.findByRole("heading", { level: 1 });
    const main = document.querySelector("main")!;
    expect(untranslated(main)).toEqual([]);
  });
});
