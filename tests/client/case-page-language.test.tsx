// The tenant's case page in Welsh and in the pseudo-locale en-XA: the status, plurals and dates in the
// chosen language, an advice item with its safety caution, and (in en-XA) no English left on the page
// that skipped translation, apart from data marked translate="no" (names, addresses, messages people typed).
import { render, screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { afterEach, beforeEach, describe, expect, it } from "vitest";
import { QueryClientProvider } from "@tanstack/react-query";
import { WaitingNote } from "@/app/waiting-note";
import { TenantComplaintSection } from "@/features/complaints/components/tenant-complaint-section";
import { createQueryClient } from "@/lib/query-client";
import { setQueueBackends, type QueuedReport } from "@/features/report/lib/report-queue";
import { clearCsrfToken } from "@/lib/api-client";
import { adviseForHome } from "@/lib/domain/home-advice";
import { showLanguage } from "@/lib/i18n/i18n";
import { rememberChoice } from "@/lib/i18n/choice";
import type { Lng } from "@/lib/i18n/languages";

/** The language chosen on this device (as the switch does), so the signed-in shell shows it too. */
async function choose(lng: Lng): Promise<void> {
  rememberChoice(lng);
  await showLanguage(lng);
}
import { mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

// Our own fiction.
const theCase = {
  id: 42,
  reference: "DW-2026-00042",
  status: "works-planned",
  assigneeId: null,
  hazardClass: null,
  hazardClassReason: null,
  tenantUserId: users.tenant.id,
  channel: "tenant-online",
  awareAt: "2026-01-10T08:00:00.000Z",
  createdAt: "2026-01-10T08:00:00.000Z",
  description: "Black mould in the bedroom corner",
  locations: ["corner"],
  observations: ["mould-spots", "condensation"],
  since: "months",
  area: "a4",
  vulnerability: null,
  equipment: null,
  property: {
    id: 5,
    addressLine1: "3 Fenwick Yard",
    addressLine2: null,
    town: "Easterby",
    postcode: "ZX3 1AB",
    estate: "Fenwick",
  },
  rooms: [{ id: 2, name: "Bedroom", kind: "bedroom" }],
  homeRooms: [{ id: 2, name: "Bedroom", kind: "bedroom" }],
};

const officer = { name: "Ffion Rhys", role: "officer" };
const message = (id: number, at: string, body: string) => ({
  id,
  type: "message-to-tenant",
  at,
  actor: officer,
  before: null,
  after: { body },
  email: null,
});
const events = [
  {
    id: 3,
    type: "case-created",
    at: "2026-01-10T08:00:00.000Z",
    actor: { name: "Tenant Test", role: "tenant" },
    before: null,
    after: {},
    email: null,
  },
  {
    id: 4,
    type: "status-changed",
    at: "2026-01-11T09:00:00.000Z",
    actor: officer,
    before: { status: "new" },
    after: { status: "triaged" },
    email: null,
  },
  {
    id: 8,
    type: "photos-added",
    at: "2026-01-10T08:01:00.000Z",
    actor: { name: "Tenant Test", role: "tenant" },
    before: null,
    after: { photoIds: [7, 8] },
    email: null,
  },
  message(5, "2026-01-12T10:00:00.000Z", "We will send someone to look at the bedroom."),
  message(6, "2026-01-13T10:00:00.000Z", "The mould wash is booked."),
  message(7, "2026-01-14T10:30:00.000Z", "See you on Tuesday."),
];

const photo = (id: number) => ({
  id,
  url: `/api/photos/${id}`,
  thumbnailUrl: `/api/photos/${id}/thumbnail`,
  width: 1600,
  height: 1200,
  sha256: "cd".repeat(32),
  workOrderId: null,
  createdAt: "2026-01-10T08:01:00.000Z",
});

const washOrder = {
  caseId: 42,
  caseReference: "DW-2026-00042",
  priority: "urgent",
  targetDate: "2026-12-11",
  property: { id: 5, addressLine1: "3 Fenwick Yard", town: "Easterby", postcode: "ZX3 1AB", estate: "Fenwick" },
  contractor: null,
  completion: null,
  createdAt: "2026-11-30T09:00:00.000Z",
  id: 8,
  status: "scheduled",
  type: "mould-wash",
  description: "Treat the mould in the bedroom corner.",
  rooms: [{ id: 2, name: "Bedroom" }],
  assignee: { id: 8, name: "Nell Okoro" },
  slot: { date: "2026-12-08", window: "am", startsAt: "2026-12-08T08:00:00.000Z", endsAt: "2026-12-08T12:00:00.000Z" },
  booking: null,
  bookings: [],
  accessNotes: null,
};

// Advice worked out by the real rules for a solid brick terrace with single glazing.
const advice = adviseForHome({
  wallType: "solid-brick",
  glazingType: "single",
  heatingType: "gas-boiler",
  ventilation: "trickle-vents-and-fans",
  roomKinds: ["bedroom"],
  riskState: null,
  observations: ["mould-spots"],
});

function caseApi() {
  return mockApi({
    "GET /api/auth/me": { body: users.tenant },
    "GET /api/auth/csrf": { body: { csrfToken: "csrf-1" } },
    "GET /api/cases/42": { body: theCase },
    "GET /api/cases/42/events": { body: { events } },
    "GET /api/cases/42/photos": { body: { photos: [photo(7), photo(8)] } },
    "GET /api/cases/42/readings": { body: { readings: [] } },
    "GET /api/cases/42/work-orders": { body: { workOrders: [washOrder] } },
    "GET /api/cases/42/messages": {
      body: {
        messages: [
          {
            id: 9,
            kind: "to-tenant",
            at: "2026-01-14T11:00:00.000Z",
            author: officer,
            mine: false,
            body: "Please open the bedroom window for ten minutes each morning.",
            photos: [{ id: 7, url: "/api/photos/7", thumbnailUrl: "/api/photos/7/thumbnail" }],
            readBy: [],
          },
        ],
        unread: 1,
        readUpTo: null,
      },
    },
    "POST /api/cases/42/messages/read": { body: { unread: 0, readUpTo: 9 } },
    "GET /api/cases/42/advice": { body: { caseId: 42, items: advice.items, safety: advice.safety, support: null } },
  });
}

async function openCase() {
  renderApp("/cases/42");
  expect(await screen.findByRole("heading", { level: 1, name: "DW-2026-00042" })).toBeInTheDocument();
  // Wait for the parts that load on their own: the repairs and the landlord's latest message.
  await screen.findByText("See you on Tuesday.");
  await waitFor(() => expect(document.getElementById("case-repairs")).not.toBeNull());
}

/** The page's own text (its main region), every text node not inside an element marked translate="no". */
function translatableText(root: Element): string[] {
  const out: string[] = [];
  const walker = document.createTreeWalker(root, NodeFilter.SHOW_TEXT);
  for (let node = walker.nextNode(); node; node = walker.nextNode()) {
    const text = node.textContent?.trim() ?? "";
    if (!text || node.parentElement?.closest('[translate="no"]')) continue;
    out.push(text);
  }
  return out;
}

describe("the tenant's case page in another language", () => {
  beforeEach(() => clearCsrfToken());
  afterEach(async () => {
    window.localStorage.clear();
    await showLanguage("en");
  });

  it("reads in Welsh: the status, a plural, a date, the repair's day and an advice item with its caution", async () => {
    await choose("cy");
    caseApi();
    await openCase();
    expect(screen.getByText("Atgyweirio wedi'i gynllunio")).toBeInTheDocument();
    expect(screen.getByText("Mae gwaith atgyweirio wedi'i gynllunio.")).toBeInTheDocument();
    // The date the report was sent, in London time and Welsh month names.
    expect(screen.getByText(/Anfonwyd ar 10 Ionawr 2026/)).toBeInTheDocument();
    // Welsh plurals: "2 lun" (dau lun), and the landlord's two earlier messages behind a button.
    expect(screen.getByText("2 lun.")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Dangos y 2 neges gynharach" })).toBeInTheDocument();
    expect(screen.getByText(/14 Ion 2026, 10:30/)).toBeInTheDocument();
    const repairs = screen.getByRole("region", { name: "Atgyweiriadau" });
    expect(within(repairs).getByRole("heading", { name: "Glanhau a thrin y llwydni" })).toBeInTheDocument();
    expect(within(repairs).getByText(/Hoffen ni ddod ar Dydd Mawrth 8 Rhagfyr.*yn y bore/)).toBeInTheDocument();
    expect(within(repairs).getByRole("button", { name: "Cadarnhau'r apwyntiad hwn" })).toBeInTheDocument();

    await userEvent.setup().click(screen.getByRole("button", { name: "Cyngor ar gyfer eich cartref" }));
    const section = screen.getByRole("region", { name: "Cyngor ar gyfer eich cartref" });
    expect(within(section).getByText(/Cadwch yn ddiogel: Peidiwch byth â gwresogi ystafell gyda ffwrn, hob/)).toBeInTheDocument();
    expect(within(section).getByText(/carbon monocsid, nwy na allwch ei weld na'i arogli/)).toBeInTheDocument();
    expect(within(section).getByText("Mae larwm carbon monocsid yn syniad da ger unrhyw offer nwy.")).toBeInTheDocument();
    expect(within(section).getByRole("heading", { name: "Ffilm ffenest glir ar wydr sengl, os yw'ch landlord yn cytuno" }));
    // The home's own facts go into the words, joined the Welsh way ("a", not "and").
    expect(within(section).getByText(/Mae gan eich cartref waliau brics solet a gwydr sengl, sy'n oeri\./)).toBeInTheDocument();
    expect(within(section).getAllByText(/O ble daw hyn:/)).toHaveLength(advice.items.length + 1);
  });

  it("reads the conversation and the photos in Welsh: the unread note, who wrote, the box to write in", async () => {
    await choose("cy");
    caseApi();
    await openCase();
    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Negeseuon gyda'ch landlord" }));
    const messages = screen.getByRole("region", { name: "Negeseuon gyda'ch landlord" });
    expect(await within(messages).findByText("1 neges newydd gan eich landlord ers i chi edrych ddiwethaf.")).toBeInTheDocument();
    expect(within(messages).getByRole("heading", { name: "Ffion Rhys, Swyddog tai" })).toBeInTheDocument();
    expect(within(messages).getByText("Newydd")).toBeInTheDocument();
    expect(within(messages).getByText(/14 Ion 2026, 11:00/)).toBeInTheDocument();
    expect(within(messages).getByRole("img", { name: "Llun 1 o 1 (yn agor yn ei faint llawn)" })).toBeInTheDocument();
    expect(within(messages).getByLabelText("Ysgrifennu at eich landlord")).toBeInTheDocument();
    // An empty message is stopped in Welsh, before anything is sent.
    await user.click(within(messages).getByRole("button", { name: "Anfon at eich landlord" }));
    expect(within(messages).getByText("Ysgrifennwch y neges.")).toBeInTheDocument();

    await user.click(screen.getByRole("button", { name: "Lluniau" }));
    const photos = screen.getByRole("region", { name: "Lluniau" });
    expect(await within(photos).findByRole("button", { name: /^Agor llun 1 o 2.*ychwanegwyd 10 Ion 2026/ })).toBeInTheDocument();
  });

  it("tells what has happened in Welsh: who did what, the status in the tenant's words, plurals and dates", async () => {
    await choose("cy");
    caseApi();
    await openCase();
    await userEvent.setup().click(screen.getByRole("button", { name: "Beth sydd wedi digwydd hyd yma" }));
    const timeline = screen.getByRole("region", { name: "Beth sydd wedi digwydd hyd yma" });
    expect(await within(timeline).findByText("Fe anfonoch chi'r adroddiad hwn.")).toBeInTheDocument();
    expect(within(timeline).getByText("Ychwanegwyd 2 lun gennych chi.")).toBeInTheDocument();
    expect(within(timeline).getByText("Newidiodd y statws i “Yn cael ei ystyried”.")).toBeInTheDocument();
    expect(
      within(timeline).getByText(/^Roedd yn “Wedi'i anfon”\. Mae eich landlord wedi darllen eich adroddiad/),
    ).toBeInTheDocument();
    expect(within(timeline).getAllByText("Anfonodd Ffion Rhys (Swyddog tai) neges atoch chi.")).toHaveLength(3);
    expect(within(timeline).getByText("11 Ion 2026, 09:00")).toBeInTheDocument();
    // What the landlord typed is shown as written, marked as not for translation.
    expect(within(timeline).getByText("The mould wash is booked.").closest('[translate="no"]')).not.toBeNull();
  });

  it("leaves no English behind in en-XA: every string on the page went through translation, data apart", async () => {
    await choose("en-XA");
    caseApi();
    await openCase();
    // The advice opened too, with its items, cautions and sources.
    const adviceSection = document.getElementById("case-advice")!;
    await userEvent.setup().click(within(adviceSection).getByRole("button"));
    expect(within(adviceSection).getAllByRole("listitem").length).toBeGreaterThan(advice.items.length);
    // The conversation (with a message from the landlord), the photos and the timeline open too.
    const user = userEvent.setup();
    await user.click(within(document.getElementById("case-timeline")!).getAllByRole("button")[0]!);
    await within(document.getElementById("case-timeline")!).findAllByRole("listitem");
    await user.click(within(document.getElementById("case-messages")!).getAllByRole("button")[0]!);
    await within(document.getElementById("case-messages")!).findByText(/ten minutes each morning/);
    await user.click(within(document.getElementById("case-photos")!).getAllByRole("button")[0]!);
    await within(document.getElementById("case-photos")!).findAllByRole("listitem");
    const main = screen.getByRole("main");
    const untranslated = translatableText(main).filter((text) => /[A-Za-z]{3,}/.test(text) && !/⟦[\s\S]*⟧/.test(text));
    expect(untranslated).toEqual([]);
  });
  it("lists the reports with unread messages on My reports in Welsh and, in en-XA, leaves no English behind", async () => {
    const reportsApi = () =>
      mockApi({
        "GET /api/auth/me": { body: users.tenant },
        "GET /api/me/cases": { body: { items: [] } },
        "GET /api/me/unread-messages": {
          body: {
            items: [{ caseId: 42, reference: "DW-2026-00042", unread: 2, latestAt: "2026-01-14T11:00:00.000Z" }],
            total: 2,
          },
        },
      });
    await choose("cy");
    reportsApi();
    renderApp("/cases");
    const box = (await screen.findByRole("heading", { name: /^Mae eich landlord wedi ysgrifennu atoch chi/ })).closest(
      "section",
    )!;
    expect(within(box).getByText("(2 neges newydd)")).toBeInTheDocument();
    expect(within(box).getByRole("link", { name: "Adroddiad DW-2026-00042" })).toHaveAttribute("href", "/cases/42#case-messages");
    expect(within(box).getByText(/2 neges newydd gan eich landlord/)).toBeInTheDocument();

    await choose("en-XA");
    reportsApi();
    renderApp("/cases");
    const pseudoBox = (await screen.findByRole("link", { name: /DW-2026-00042/ })).closest("section")!;
    const untranslated = translatableText(pseudoBox).filter((text) => /[A-Za-z]{3,}/.test(text) && !/⟦[\s\S]*⟧/.test(text));
    expect(untranslated).toEqual([]);
  });

  it("shows a complaint in Welsh and, in en-XA, leaves no English behind but what the people wrote", async () => {
    const stage = (n: number, over: Record<string, unknown> = {}) => ({
      stage: n,
      startedAt: null,
      acknowledgeDueAt: null,
      acknowledgedAt: null,
      acknowledge: "not-started",
      respondDueAt: null,
      respondedAt: null,
      respond: "not-started",
      extensionWorkingDays: null,
      extensionReason: null,
      response: null,
      ...over,
    });
    const complaint = {
      id: 7,
      caseId: 42,
      status: "stage-1-responded",
      version: 3,
      raisedAt: "2026-12-21T10:00:00.000Z",
      raisedBy: { name: "Tenant Test", role: "tenant" },
      onBehalf: false,
      description: "Nobody came to look at the mould for three weeks.",
      escalatedAt: null,
      escalationReason: null,
      closedAt: null,
      stages: [
        stage(1, {
          startedAt: "2026-12-21T10:00:00.000Z",
          acknowledgeDueAt: "2026-12-30T23:59:59.999Z",
          acknowledgedAt: "2026-12-22T10:00:00.000Z",
          acknowledge: "met",
          respondDueAt: "2027-01-28T23:59:59.999Z",
          respondedAt: "2027-01-20T10:00:00.000Z",
          respond: "met",
          extensionWorkingDays: 2,
          extensionReason: "The surveyor's report is due next week.",
          response: "We are sorry for the wait; the works are booked.",
        }),
        stage(2),
      ],
      remedy: {
        apology: true,
        apologyText: null,
        putRight: null,
        compensationOfferedPence: 5000,
        compensationOfferedOn: "2027-01-20",
        compensationAcceptedOn: null,
        compensationPaidPence: null,
        compensationPaidOn: null,
      },
      extensionMaxWorkingDays: 10,
      staffNote: null,
    };
    const show = () => {
      mockApi({ "GET /api/cases/42/complaints": { body: { complaints: [complaint] } } });
      return render(
        <QueryClientProvider client={createQueryClient()}>
          <TenantComplaintSection caseId={42} />
        </QueryClientProvider>,
      );
    };
    await choose("cy");
    const { unmount } = show();
    expect(await screen.findByText("Cam 1: wedi ymateb")).toBeInTheDocument();
    expect(screen.getByText("Gwnaed ar Dydd Llun 21 Rhagfyr 2026")).toBeInTheDocument();
    expect(screen.getAllByText("Mewn pryd")).toHaveLength(2);
    expect(screen.getByText(/^Estynnwyd o 2 ddiwrnod gwaith/)).toBeInTheDocument();
    expect(screen.getByText("Cynigiwyd £50.00")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Mynd â'm cwyn i gam 2" })).toBeInTheDocument();
    await userEvent.setup().click(screen.getByRole("button", { name: "Mynd â'm cwyn i gam 2" }));
    expect(screen.getByText("Ysgrifennwch hyn cyn anfon.")).toBeInTheDocument();
    unmount();

    await choose("en-XA");
    const { container } = show();
    await screen.findByText(/three weeks/);
    const untranslated = translatableText(container).filter((text) => /[A-Za-z]{3,}/.test(text) && !/⟦[\s\S]*⟧/.test(text));
    expect(untranslated).toEqual([]);
  });

  it("says a report is waiting on this phone in the device's language, with no signal to check who is signed in", async () => {
    const kept = [{ id: "q1", userId: users.tenant.id } as QueuedReport];
    setQueueBackends({ storage: { read: async () => kept, write: async () => undefined } });
    try {
      rememberChoice("cy");
      const { unmount } = render(<WaitingNote />);
      expect(await screen.findByText("Mae eich adroddiad yn aros i gael ei anfon")).toBeInTheDocument();
      expect(screen.getByText(/Bydd yn anfon ei hun pan fyddwch chi ar-lein eto/)).toBeInTheDocument();
      unmount();

      rememberChoice("en-XA");
      render(<WaitingNote />);
      // The title and the sentence both went through translation.
      expect(await screen.findAllByText(/^⟦[\s\S]*⟧$/)).toHaveLength(2);
    } finally {
      setQueueBackends({});
    }
  });
});
