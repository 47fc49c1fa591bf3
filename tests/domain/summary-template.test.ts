// The written summary's draft (src/features/case-workspace/lib/summary-template.ts): a pure
// function, so it is tested here with the other pure modules. Times are Europe/London: GMT
// (UTC+0) in winter and BST (UTC+1) from the last Sunday in March to the last Sunday in October,
// Summer Time Act 1972 as amended (from memory).
import { describe, expect, it } from "vitest";
import {
  buildSummaryTemplate,
  hasPlaceholder,
  latestAssessment,
  latestInspection,
  type SummaryTemplateInput,
} from "@/features/case-workspace/lib/summary-template";

const base: SummaryTemplateInput = {
  reference: "DW-2026-00042",
  address: "1 Tanner Row, Easterby, ZX3 1AA",
  inspections: [],
  assessments: [],
  deadlines: [],
  sender: { name: "Priya Venn", role: "Housing officer" },
};

const earlier = {
  inspectedAt: "2026-01-12T09:00:00.000Z",
  cause: "plumbing-leak",
  mouldExtent: "none",
  findings: "Dripping waste pipe under the sink.",
};
const later = {
  inspectedAt: "2026-01-14T10:30:00.000Z",
  cause: "condensation",
  mouldExtent: "1-to-5-m2",
  findings: "Mould behind the wardrobe on the external wall.",
};

const deadlines = [
  { stage: "make-safe", dueAt: null, doneAt: null, state: "not-applicable" },
  { stage: "investigate", dueAt: "2026-01-23T23:59:59.999Z", doneAt: "2026-01-12T09:00:00.000Z", state: "met" },
  { stage: "summary", dueAt: "2026-01-15T23:59:59.999Z", doneAt: null, state: "pending" },
  { stage: "safety-work", dueAt: "2026-01-19T23:59:59.999Z", doneAt: null, state: "pending" },
  // 23:59 BST on 1 July is 22:59 UTC.
  { stage: "supplementary-work", dueAt: "2026-07-01T22:59:59.999Z", doneAt: null, state: "pending" },
];

describe("written summary template", () => {
  it("reports the latest inspection, the latest assessment and what will be done by when, in London time", () => {
    const text = buildSummaryTemplate({
      ...base,
      // Given out of order: the latest inspection is the later one, the latest assessment the highest version.
      inspections: [later, earlier],
      assessments: [
        { version: 2, band: "B", category: 1 },
        { version: 1, band: "E", category: 2 },
      ],
      deadlines,
    });
    expect(text).toContain("(reference DW-2026-00042) at 1 Tanner Row, Easterby, ZX3 1AA.");
    expect(text).toContain("We inspected your home on Wednesday 14 January 2026.");
    // The officer's own notes are never copied into the tenant's letter: the officer writes that part.
    expect(text).not.toContain(later.findings);
    expect(text).not.toContain(earlier.findings);
    expect(text).toContain("[Fill in: what we found, in plain words for the tenant]");
    expect(text).toContain("We saw mould over between 1 and 5 square metres.");
    expect(text).toContain(
      "Condensation: moisture in the air indoors is settling on surfaces in your home that are colder than they should be.",
    );
    expect(text).toContain("It is a Category 1 hazard: the most serious kind");
    // No band letters, zone names or greeting: the tenant reads plain words, and the e-mail greets them by name.
    expect(text).not.toMatch(/\bband\b/i);
    expect(text).not.toMatch(/\b(GMT|BST)\b/);
    expect(text).not.toMatch(/^\s*(hello|dear)\b/i);
    // A deadline at 23:59 London time is "the end of" that day: 19 January is GMT, 1 July is BST (22:59 UTC).
    expect(text).toContain("- We will begin the work to remove the risk to your health by the end of Monday 19 January 2026.");
    expect(text).toContain(
      "- We will begin the further work to stop the damp and mould coming back by the end of Wednesday 1 July 2026.",
    );
    // The summary itself and stages that are done or do not apply are not promised again.
    expect(text).not.toMatch(/15 January 2026/);
    expect(text).not.toMatch(/make your home safe/);
    expect(text.trimEnd().endsWith("Priya Venn\nHousing officer")).toBe(true);
    // The officer still writes what the work is.
    expect(hasPlaceholder(text)).toBe(true);
    expect(text).toContain("[Fill in: the work we will do, room by room]");
  });

  it("owns up to a missed stage instead of promising a date already past", () => {
    const text = buildSummaryTemplate({
      ...base,
      inspections: [later],
      deadlines: [{ stage: "safety-work", dueAt: "2026-01-19T23:59:59.999Z", doneAt: null, state: "missed" }],
    });
    expect(text).toContain(
      "We will begin the work to remove the risk to your health as soon as possible: we should have done so by the end of Monday 19 January 2026",
    );
  });

  it("leaves clearly marked gaps where the case cannot say", () => {
    const text = buildSummaryTemplate({ ...base, reference: null, inspections: [{ ...later, cause: "other-unknown" }] });
    expect(text).toContain("We have not found the cause yet. [Fill in: what we will do next to find it]");
    expect(text).toContain(
      "We will tell you the result of our Housing Health and Safety Rating System (HHSRS) assessment when it is complete.",
    );
    expect(text).toContain("[Fill in: when we will start and finish the work]");
    expect(text).not.toContain("reference");

    const none = buildSummaryTemplate(base);
    expect(none).toContain("[Fill in: what we found when we inspected your home]");
    expect(none).toContain("[Fill in: the cause we found]");
  });

  it("says a Category 2 hazard in plain words and never pastes the officer's notes or their markup", () => {
    const marked = {
      ...later,
      findings: "<b>RAW-NOTE</b> ext wall N/E, tenant v. upset",
      roomReadings: [{ roomId: 4 }, { roomId: 5 }],
    };
    const text = buildSummaryTemplate({ ...base, inspections: [marked], assessments: [{ version: 1, band: "E", category: 2 }] });
    expect(text).toContain("It is a Category 2 hazard: a risk to health that is less serious than Category 1.");
    expect(text).toContain("We took measurements in 2 rooms.");
    expect(text).not.toContain("RAW-NOTE");
    expect(text).not.toMatch(/<[a-z/]/i);
    expect(text).not.toMatch(/\bband\b/i);
  });

  it("never describes the household, only the building", () => {
    for (const cause of ["condensation", "penetrating-damp", "rising-damp", "plumbing-leak", "roof-gutter", "other-unknown"]) {
      const text = buildSummaryTemplate({ ...base, inspections: [{ ...later, cause, findings: "Findings." }] }).toLowerCase();
      for (const word of ["lifestyle", "drying clothes", "your heating habits", "you should ventilate"])
        expect(text).not.toContain(word);
    }
  });

  it("picks the latest inspection by date and the latest assessment by version", () => {
    expect(latestInspection([later, earlier])).toBe(later);
    expect(latestInspection([])).toBeNull();
    expect(
      latestAssessment([
        { version: 1, band: "E", category: 2 },
        { version: 3, band: "C", category: 1 },
        { version: 2, band: "D", category: 2 },
      ])?.version,
    ).toBe(3);
  });

  it("finds a placeholder wherever it is left", () => {
    expect(hasPlaceholder("All done.")).toBe(false);
    expect(hasPlaceholder("We will [Fill in: the work] soon.")).toBe(true);
  });
});
