import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { mockApi, users, type MockReply, type RecordedCall } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const HOUR = 3_600_000;
const staff = [
  { id: 2, name: "Priya Venn", role: "officer" },
  { id: 3, name: "Dale Whitcombe", role: "maintenance" },
];

function makeItem(id: number, overrides: Record<string, unknown> = {}) {
  return {
    id,
    reference: `DW-2026-${String(id).padStart(5, "0")}`,
    status: "new",
    channel: "tenant-online",
    awareAt: "2026-03-02T09:30:00.000Z",
    createdAt: "2026-03-02T09:30:00.000Z",
    property: {
      id: 100 + id,
      addressLine1: `${id} Heron Walk`,
      town: "Easterby",
      postcode: `ZX5 ${id}AB`,
      estate: "Kestrel Rise",
      block: null,
    },
    rooms: [{ id: 1, name: "Bedroom 1" }],
    riskState: "mould-risk",
    mouldIndex: 1.4,
    area: "a4",
    vulnerableHousehold: false,
    hazardClass: null,
    hhsrs: null,
    priority: 50,
    nextDeadline: { stage: "investigate", dueAt: new Date(Date.now() + 6 * 24 * HOUR).toISOString() },
    overdue: false,
    assignee: null,
    ...overrides,
  };
}

const page = (call: RecordedCall, items: ReturnType<typeof makeItem>[], total = items.length) => ({
  body: { items, total, page: Number(call.search.get("page") ?? 1), pageSize: Number(call.search.get("pageSize") ?? 25) },
});

function setup(url: string, routes: Record<string, MockReply | ((call: RecordedCall, nth: number) => MockReply)> = {}) {
  const api = mockApi({
    "GET /api/auth/me": { body: users.officer },
    "GET /api/auth/csrf": { body: { csrfToken: "queue-token" } },
    "GET /api/staff": { body: { users: staff } },
    "GET /api/properties/estates": { body: { estates: ["Kestrel Rise", "Millbeck Terraces"] } },
    "GET /api/cases": (call) => page(call, [makeItem(1), makeItem(2, { status: "triaged" }), makeItem(3)], 3),
    ...routes,
  });
  return { ...api, ...renderApp(url) };
}

const rowsOf = (table: HTMLElement) => within(table).getAllByRole("row").slice(1);
const search = (router: { state: { location: { search: string } } }) => new URLSearchParams(router.state.location.search);

describe("Case queue", () => {
  beforeEach(() => {
    clearCsrfToken();
    window.localStorage.clear();
  });

  it("opens on open cases, most urgent first, 25 a page", async () => {
    const { callsTo } = setup("/queue");
    expect(await screen.findByRole("heading", { level: 1, name: "Case queue" })).toBeInTheDocument();
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(3));

    const first = callsTo("GET", "/api/cases")[0]!.search;
    expect(Object.fromEntries(first)).toEqual({ status: "open", sort: "priority", order: "desc", page: "1", pageSize: "25" });
    expect(screen.getByRole("button", { name: "Status Open cases" })).toBeInTheDocument();
    expect(within(table).getByRole("columnheader", { name: "Priority" })).toHaveAttribute("aria-sort", "descending");
    expect(within(table).getByRole("columnheader", { name: "Reference" })).toHaveAttribute("aria-sort", "none");
    expect(within(table).getByRole("link", { name: "DW-2026-00001" })).toHaveAttribute("href", "/cases/1");
    expect(within(rowsOf(table)[1]!).getByText("Triaged")).toBeInTheDocument();
    expect(screen.getByText("Showing 1–3 of 3 cases")).toBeInTheDocument();
    expect(screen.getByText("Page 1 of 1")).toBeInTheDocument();
    // Homes have their own page now.
    expect(screen.queryByRole("table", { name: "Homes" })).not.toBeInTheDocument();
  });

  it("asks for the cases at once, without waiting for the session check to answer", async () => {
    const { fetchMock, callsTo } = mockApi({
      "GET /api/auth/me": { body: users.officer },
      "GET /api/staff": { body: { users: staff } },
      "GET /api/properties/estates": { body: { estates: ["Kestrel Rise"] } },
      "GET /api/cases": (call) => page(call, [makeItem(1)], 1),
    });
    const answer = fetchMock.getMockImplementation()!;
    let releaseMe!: () => void;
    const meHeld = new Promise<void>((resolve) => (releaseMe = resolve));
    fetchMock.mockImplementation(async (input, init) => {
      const url = typeof input === "string" ? input : input instanceof URL ? input.href : input.url;
      if (url.includes("/api/auth/me")) await meHeld;
      return answer(input, init);
    });
    renderApp("/queue");
    // The session check is still unanswered (so not yet recorded) while the queue has been asked for.
    await waitFor(() => expect(callsTo("GET", "/api/cases")).toHaveLength(1));
    expect(callsTo("GET", "/api/auth/me")).toHaveLength(0);
    releaseMe();
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(1));
    expect(callsTo("GET", "/api/cases")).toHaveLength(1);
  });

  it("reads every filter, the sort, the page and the shown columns from the URL and asks the API for them", async () => {
    const url =
      "/queue?status=triaged,new&risk=condensing,unknown&category=1&band=B,A&estate=Millbeck%20Terraces&vulnerable=true" +
      "&dueWithin=5&assignee=unassigned&q=ZX5&sort=due&order=desc&page=2&pageSize=10&cols=rooms,priority,address,due,status";
    const { callsTo, router } = setup(url, {
      "GET /api/cases": (call) => page(call, [makeItem(11)], 12),
    });
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(1));

    const sent = callsTo("GET", "/api/cases")[0]!.search;
    expect(Object.fromEntries(sent)).toEqual({
      status: "new,triaged",
      risk: "condensing,unknown",
      category: "1",
      band: "A,B",
      estate: "Millbeck Terraces",
      vulnerable: "true",
      dueWithin: "5",
      assignee: "unassigned",
      q: "ZX5",
      sort: "due",
      order: "desc",
      page: "2",
      pageSize: "10",
    });

    // The controls show the same view.
    expect(await screen.findByRole("combobox", { name: "Estate" })).toHaveValue("Millbeck Terraces");
    expect(screen.getByRole("combobox", { name: "Vulnerable household" })).toHaveValue("true");
    expect(screen.getByRole("combobox", { name: "Deadline" })).toHaveValue("5");
    expect(screen.getByRole("combobox", { name: "Assigned to" })).toHaveValue("unassigned");
    expect(screen.getByRole("searchbox", { name: "Search cases" })).toHaveValue("ZX5");
    expect(screen.getByRole("combobox", { name: "Rows per page" })).toHaveValue("10");
    expect(screen.getByRole("button", { name: "HHSRS Category 1; Band A, B" })).toBeInTheDocument();
    expect(screen.getByText("Page 2 of 2")).toBeInTheDocument();
    expect(within(table).getByRole("columnheader", { name: "Next deadline" })).toHaveAttribute("aria-sort", "descending");
    expect(within(table).getByRole("columnheader", { name: "Rooms" })).toBeInTheDocument();
    expect(within(table).queryByRole("columnheader", { name: "Risk state" })).not.toBeInTheDocument();
    expect(within(table).queryByRole("columnheader", { name: "Channel" })).not.toBeInTheDocument();

    const user = userEvent.setup();
    const statusButton = screen.getByRole("button", { name: "Status New, Triaged" });
    await user.click(statusButton);
    expect(statusButton).toHaveAttribute("aria-expanded", "true");
    expect(screen.getByRole("checkbox", { name: "New" })).toBeChecked();
    expect(screen.getByRole("checkbox", { name: "Triaged" })).toBeChecked();
    expect(screen.getByRole("checkbox", { name: "Inspection booked" })).not.toBeChecked();
    // Ticking one more status goes to the URL and back to page 1.
    await user.click(screen.getByRole("checkbox", { name: "Inspection booked" }));
    await waitFor(() => expect(search(router).get("status")).toBe("new,triaged,inspection-booked"));
    expect(search(router).get("page")).toBeNull();
    await waitFor(() => expect(callsTo("GET", "/api/cases").at(-1)!.search.get("status")).toBe("new,triaged,inspection-booked"));
    await user.keyboard("{Escape}");
    expect(statusButton).toHaveAttribute("aria-expanded", "false");
    expect(statusButton).toHaveFocus();

    // A shared link reproduces the view: the same URL gives the same request.
    await user.selectOptions(screen.getByRole("combobox", { name: "Deadline" }), "overdue");
    await waitFor(() => expect(search(router).get("overdue")).toBe("true"));
    expect(search(router).get("dueWithin")).toBeNull();
    const last = callsTo("GET", "/api/cases").at(-1)!.search;
    expect(last.get("overdue")).toBe("true");
    expect(last.has("dueWithin")).toBe(false);

    await user.click(screen.getByRole("button", { name: "Clear filters" }));
    await waitFor(() =>
      expect(Object.fromEntries(search(router))).toEqual({
        sort: "due",
        order: "desc",
        pageSize: "10",
        cols: "rooms,priority,address,due,status",
      }),
    );
  });

  it("sorts on the server when a column heading is pressed, and says so with aria-sort", async () => {
    const { callsTo, router } = setup("/queue?page=3");
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(3));
    const user = userEvent.setup();

    await user.click(within(table).getByRole("button", { name: "Reference" }));
    await waitFor(() => expect(router.state.location.search).toBe("?sort=reference"));
    await waitFor(() =>
      expect(within(table).getByRole("columnheader", { name: "Reference" })).toHaveAttribute("aria-sort", "ascending"),
    );
    expect(within(table).getByRole("columnheader", { name: "Priority" })).toHaveAttribute("aria-sort", "none");
    let sent = callsTo("GET", "/api/cases").at(-1)!.search;
    expect([sent.get("sort"), sent.get("order"), sent.get("page")]).toEqual(["reference", "asc", "1"]);

    await user.click(within(table).getByRole("button", { name: "Reference" }));
    await waitFor(() => expect(search(router).get("order")).toBe("desc"));
    await waitFor(() =>
      expect(within(table).getByRole("columnheader", { name: "Reference" })).toHaveAttribute("aria-sort", "descending"),
    );
    sent = callsTo("GET", "/api/cases").at(-1)!.search;
    expect([sent.get("sort"), sent.get("order")]).toEqual(["reference", "desc"]);

    // Priority starts with the most urgent.
    await user.click(within(table).getByRole("button", { name: "Priority" }));
    await waitFor(() => expect(router.state.location.search).toBe(""));
    sent = callsTo("GET", "/api/cases").at(-1)!.search;
    expect([sent.get("sort"), sent.get("order")]).toEqual(["priority", "desc"]);
  });

  it("opens with the six usual columns, shows another from the Columns menu, and remembers the choice", async () => {
    const { router, unmount } = setup("/queue");
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(3));
    const headings = () =>
      within(table)
        .getAllByRole("columnheader")
        .map((th) => th.textContent);
    // The tick box, then what an officer picks the next case by; the rest wait behind the menu.
    expect(headings()).toEqual(["", "Reference", "Priority", "Home", "Risk state", "Next deadline", "Status"]);
    expect(within(rowsOf(table)[0]!).queryByText("Online (tenant)")).not.toBeInTheDocument();

    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: "Columns 9 hidden" }));
    expect(screen.getByRole("checkbox", { name: "Priority" })).toBeChecked();
    const channel = screen.getByRole("checkbox", { name: "Channel" });
    expect(channel).not.toBeChecked();
    expect(screen.getByRole("button", { name: "Usual columns" })).toBeDisabled();
    await user.click(channel);

    await waitFor(() => expect(search(router).get("cols")).not.toBeNull());
    expect(search(router).get("cols")?.split(",").sort()).toEqual(["address", "channel", "due", "priority", "risk", "status"]);
    await waitFor(() => expect(within(table).getByRole("columnheader", { name: "Channel" })).toBeInTheDocument());
    expect(within(rowsOf(table)[0]!).getByText("Online (tenant)")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Columns 8 hidden" })).toBeInTheDocument();
    const link = router.state.location.pathname + router.state.location.search;
    unmount();

    // The same link shows the same columns; so does a plain /queue in this browser.
    for (const url of [link, "/queue"]) {
      const view = setup(url);
      const again = await screen.findByRole("table", { name: "Case queue" });
      await waitFor(() => expect(rowsOf(again)).toHaveLength(3));
      expect(within(again).getByRole("columnheader", { name: "Channel" })).toBeInTheDocument();
      expect(within(again).getByRole("columnheader", { name: "Home" })).toBeInTheDocument();
      view.unmount();
    }

    // "Usual columns" goes back to the six, and the link drops its cols.
    const last = setup("/queue");
    const table3 = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table3)).toHaveLength(3));
    await user.click(screen.getByRole("button", { name: "Columns 8 hidden" }));
    await user.click(screen.getByRole("button", { name: "Usual columns" }));
    await waitFor(() => expect(within(table3).queryByRole("columnheader", { name: "Channel" })).not.toBeInTheDocument());
    expect(search(last.router).get("cols")).toBeNull();
  });

  it("says in words how far past its deadline a case is, and how long others have left", async () => {
    setup("/queue", {
      "GET /api/cases": (call) =>
        page(call, [
          makeItem(1, {
            overdue: true,
            nextDeadline: { stage: "investigate", dueAt: new Date(Date.now() - 50 * HOUR).toISOString() },
          }),
          makeItem(2, { nextDeadline: { stage: "make-safe", dueAt: new Date(Date.now() + 5.5 * HOUR).toISOString() } }),
          makeItem(3, { nextDeadline: null }),
        ]),
    });
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(3));
    const [overdue, soon, none] = rowsOf(table);
    expect(within(overdue!).getByText("Overdue by 2 days")).toBeInTheDocument();
    expect(within(soon!).getByText("Due in 5 hours")).toBeInTheDocument();
    expect(within(soon!).getByText(/^Make safe,/)).toBeInTheDocument();
    expect(within(none!).getByText("No deadline running")).toBeInTheDocument();
  });

  it("assigns the ticked cases after a confirmation, then shows what changed and what did not", async () => {
    let served = 0;
    const { callsTo } = setup("/queue", {
      "GET /api/cases": (call) => {
        served += 1;
        return page(call, [makeItem(1), makeItem(2), makeItem(3)]);
      },
      "POST /api/cases/bulk": {
        body: { updated: [1], failed: [{ id: 3, reference: "DW-2026-00003", message: "This case is closed; reopen it first." }] },
      },
    });
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(3));
    const user = userEvent.setup();

    await user.click(within(table).getByRole("checkbox", { name: "Select DW-2026-00001" }));
    await user.click(within(table).getByRole("checkbox", { name: "Select DW-2026-00003" }));
    expect(screen.getByText("2 selected")).toBeInTheDocument();

    // Cancelling changes nothing.
    await user.click(screen.getByRole("button", { name: "Assign to…" }));
    let dialog = await screen.findByRole("dialog", { name: "Assign 2 cases?" });
    await user.click(within(dialog).getByRole("button", { name: "Cancel" }));
    expect(callsTo("POST", "/api/cases/bulk")).toHaveLength(0);

    await user.click(screen.getByRole("button", { name: "Assign to…" }));
    dialog = await screen.findByRole("dialog", { name: "Assign 2 cases?" });
    await user.click(within(dialog).getByRole("button", { name: "Assign 2 cases" }));
    expect(within(dialog).getByText("Choose who the cases go to.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/bulk")).toHaveLength(0);

    await user.selectOptions(within(dialog).getByRole("combobox", { name: "Assign to" }), "Priya Venn (Housing officer)");
    expect(dialog).toHaveTextContent("2 cases will be assigned to Priya Venn.");
    const before = served;
    await user.click(within(dialog).getByRole("button", { name: "Assign 2 cases" }));

    expect(await screen.findByText("1 case updated")).toBeInTheDocument();
    const post = callsTo("POST", "/api/cases/bulk");
    expect(post).toHaveLength(1);
    expect(post[0]!.body).toEqual({ ids: [1, 3], assigneeId: 2 });
    expect(post[0]!.headers.get("X-CSRF-Token")).toBe("queue-token");
    expect(screen.getByText("It was assigned to Priya Venn.")).toBeInTheDocument();
    const failures = within(screen.getByText("1 case updated").parentElement!).getByRole("list");
    expect(within(failures).getByRole("listitem")).toHaveTextContent("DW-2026-00003: This case is closed; reopen it first.");

    // The queue is fetched again and the selection is gone.
    await waitFor(() => expect(served).toBeGreaterThan(before));
    expect(screen.queryByText("2 selected")).not.toBeInTheDocument();
    expect(within(table).getByRole("checkbox", { name: "Select DW-2026-00001" })).not.toBeChecked();
  });

  it("asks for a reason before withdrawing cases in bulk", async () => {
    const { callsTo } = setup("/queue", {
      "POST /api/cases/bulk": (call) => ({ body: { updated: (call.body as { ids: number[] }).ids, failed: [] } }),
    });
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(3));
    const user = userEvent.setup();
    await user.click(within(table).getByRole("checkbox", { name: "Select every case on this page" }));
    expect(screen.getByText("3 selected")).toBeInTheDocument();

    await user.click(screen.getByRole("button", { name: "Change status…" }));
    const dialog = await screen.findByRole("dialog", { name: "Change the status of 3 cases?" });
    await user.selectOptions(within(dialog).getByRole("combobox", { name: "New status" }), "Cancelled");
    expect(dialog).toHaveTextContent("3 cases will move to Cancelled.");
    await user.click(within(dialog).getByRole("button", { name: "Move 3 cases to Cancelled" }));
    expect(within(dialog).getByText("Give a short reason (at least 3 characters).")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/bulk")).toHaveLength(0);

    await user.type(within(dialog).getByRole("textbox", { name: "Reason" }), "Reported twice by the same household");
    await user.click(within(dialog).getByRole("button", { name: "Move 3 cases to Cancelled" }));
    expect(await screen.findByText("3 cases updated")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/bulk")[0]!.body).toEqual({
      ids: [1, 2, 3],
      status: "cancelled",
      reason: "Reported twice by the same household",
    });
  });

  it("offers moves valid for every selected case apart, and names the cases a move would skip before confirming", async () => {
    const { callsTo } = setup("/queue", {
      "GET /api/cases": (call) =>
        page(call, [makeItem(1), makeItem(2, { status: "triaged" }), makeItem(3, { status: "closed" })]),
      "POST /api/cases/bulk": (call) => ({ body: { updated: (call.body as { ids: number[] }).ids.slice(0, 2), failed: [] } }),
    });
    const table = await screen.findByRole("table", { name: "Case queue" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(3));
    const user = userEvent.setup();
    await user.click(within(table).getByRole("checkbox", { name: "Select every case on this page" }));
    await user.click(screen.getByRole("button", { name: "Change status…" }));
    const dialog = await screen.findByRole("dialog", { name: "Change the status of 3 cases?" });
    const select = within(dialog).getByRole("combobox", { name: "New status" });
    // No move is valid for new, triaged and closed at once: each is offered with how many can make it.
    expect(within(select).queryByRole("group", { name: "Every selected case can move to" })).not.toBeInTheDocument();
    const some = within(select).getByRole("group", { name: "Only some can (the others are skipped)" });
    expect(
      within(some)
        .getAllByRole("option")
        .map((o) => o.textContent),
    ).toEqual(["Triaged (2 of 3)", "Inspection booked (1 of 3)", "Investigated (1 of 3)", "Cancelled (2 of 3)"]);
    await user.selectOptions(select, "Triaged (2 of 3)");
    expect(dialog).toHaveTextContent("2 cases will move to Triaged.");
    expect(within(dialog).getByText("1 case will be skipped")).toBeInTheDocument();
    expect(dialog).toHaveTextContent("DW-2026-00002 (Triaged)");
    await user.type(within(dialog).getByRole("textbox", { name: "Reason" }), "Checked with each tenant by phone");
    await user.click(within(dialog).getByRole("button", { name: "Move 2 cases to Triaged" }));
    expect(await screen.findByText("2 cases updated")).toBeInTheDocument();
    expect(callsTo("POST", "/api/cases/bulk")[0]!.body).toMatchObject({
      status: "triaged",
      reason: "Checked with each tenant by phone",
    });
  });

  it("exports the view with its filters, sort and shown columns, not just the page", async () => {
    setup("/queue?status=triaged&estate=Kestrel%20Rise&sort=due&order=asc&page=2&cols=risk,estate");
    const group = await screen.findByRole("group", { name: "Export cases in this view" });
    const href = within(group).getByRole("link", { name: /Excel/ }).getAttribute("href")!;
    const url = new URL(href, "http://x");
    expect(url.pathname).toBe("/api/cases/export");
    expect(Object.fromEntries(url.searchParams)).toEqual({
      status: "triaged",
      estate: "Kestrel Rise",
      sort: "due",
      order: "asc",
      columns: "estate,risk",
      format: "xlsx",
    });
  });

  it("says when no case matches the filters, and clears them", async () => {
    const { router } = setup("/queue?risk=condensing&q=nowhere", {
      "GET /api/cases": (call) => page(call, call.search.get("q") ? [] : [makeItem(1)]),
    });
    expect(await screen.findByText("No cases match these filters")).toBeInTheDocument();
    expect(screen.getByText("No cases")).toBeInTheDocument();
    const buttons = screen.getAllByRole("button", { name: "Clear filters" });
    const user = userEvent.setup();
    await user.click(buttons.at(-1)!);
    await waitFor(() => expect(router.state.location.search).toBe(""));
    expect(await screen.findByRole("link", { name: "DW-2026-00001" })).toBeInTheDocument();
  });

  it("tells an empty queue apart from an organisation with no cases at all", async () => {
    const first = setup("/queue", { "GET /api/cases": (call) => page(call, [], 0) });
    expect(await screen.findByText("No cases yet")).toBeInTheDocument();
    first.unmount();

    setup("/queue", {
      // Nothing open, but closed cases exist (asked for without a status filter).
      "GET /api/cases": (call) =>
        call.search.has("status") ? page(call, [], 0) : page(call, [makeItem(9, { status: "closed" })], 4),
    });
    expect(await screen.findByText("No open cases")).toBeInTheDocument();
    expect(screen.queryByText("No cases yet")).not.toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Show all statuses" })).toBeInTheDocument();
  });

  it("shows a readable error when the queue cannot be loaded", async () => {
    setup("/queue", {
      "GET /api/cases": {
        status: 400,
        body: { error: { code: "bad_request", message: "sort must be one of reference, address…" } },
      },
    });
    expect(await screen.findByText("We could not load the case queue")).toBeInTheDocument();
    expect(screen.getByText("sort must be one of reference, address…")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: "Try again" })).toBeInTheDocument();
  });
});
