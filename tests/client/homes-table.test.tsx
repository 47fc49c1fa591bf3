import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { mockApi, propertyPage, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const rowsOf = (table: HTMLElement) => within(table).getAllByRole("row").slice(1);

describe("Homes table (server-side pages)", () => {
  beforeEach(() => clearCsrfToken());

  function setup(url = "/homes", total = 60) {
    const api = mockApi({
      "GET /api/auth/me": { body: users.officer },
      "GET /api/properties": (call) => ({ body: propertyPage(call.search, total) }),
      "GET /api/properties/estates": { body: { estates: ["Kestrel Rise", "Millbeck Terraces"] } },
    });
    return { ...api, ...renderApp(url) };
  }

  it("renders the rows of the first page and moves to the next one", async () => {
    const { callsTo, router } = setup();
    const table = await screen.findByRole("table", { name: "Homes" });

    await waitFor(() => expect(rowsOf(table)).toHaveLength(25));
    expect(within(table).getByRole("columnheader", { name: "Address" })).toBeInTheDocument();
    expect(within(rowsOf(table)[0]!).getByText("Flat 1, Falcon House")).toBeInTheDocument();
    expect(within(rowsOf(table)[0]!).getByText("System-built")).toBeInTheDocument();
    expect(screen.getByText("Showing 1–25 of 60 homes")).toBeInTheDocument();
    expect(screen.getByText("Page 1 of 3")).toBeInTheDocument();
    expect(screen.getByRole("button", { name: /previous page/i })).toBeDisabled();

    const user = userEvent.setup();
    await user.click(screen.getByRole("button", { name: /next page/i }));

    expect(await screen.findByText("Flat 26, Falcon House")).toBeInTheDocument();
    expect(screen.getByText("Showing 26–50 of 60 homes")).toBeInTheDocument();
    expect(router.state.location.search).toBe("?page=2");
    const last = callsTo("GET", "/api/properties").at(-1)!;
    expect(last.search.get("page")).toBe("2");
    expect(last.search.get("pageSize")).toBe("25");

    await user.click(screen.getByRole("button", { name: /next page/i }));
    expect(await screen.findByText("Flat 51, Falcon House")).toBeInTheDocument();
    await waitFor(() => expect(rowsOf(table)).toHaveLength(10));
    expect(screen.getByRole("button", { name: /next page/i })).toBeDisabled();
  });

  it("reads its state from the URL and writes filters back to it", async () => {
    const { callsTo, router } = setup("/homes?page=2&pageSize=10", 60);
    const table = await screen.findByRole("table", { name: "Homes" });
    await waitFor(() => expect(rowsOf(table)).toHaveLength(10));
    expect(screen.getByText("Page 2 of 6")).toBeInTheDocument();
    expect(screen.getByRole("combobox", { name: "Rows per page" })).toHaveValue("10");

    const user = userEvent.setup();
    await user.selectOptions(screen.getByRole("combobox", { name: "Estate" }), "Millbeck Terraces");
    await waitFor(() => expect(new URLSearchParams(router.state.location.search).get("estate")).toBe("Millbeck Terraces"));
    // A new filter starts again at page 1.
    expect(new URLSearchParams(router.state.location.search).get("page")).toBeNull();

    await user.type(screen.getByRole("searchbox", { name: "Search homes" }), "ZX5{Enter}");
    await waitFor(() => expect(callsTo("GET", "/api/properties").at(-1)!.search.get("q")).toBe("ZX5"));
    const last = callsTo("GET", "/api/properties").at(-1)!;
    expect(last.search.get("estate")).toBe("Millbeck Terraces");
    expect(last.search.get("page")).toBe("1");
    expect(last.search.get("pageSize")).toBe("10");

    await user.selectOptions(screen.getByRole("combobox", { name: "Rows per page" }), "50");
    await waitFor(() => expect(callsTo("GET", "/api/properties").at(-1)!.search.get("pageSize")).toBe("50"));
  });

  it("offers the filtered list as CSV and Excel downloads, every page of it", async () => {
    setup("/homes?estate=Kestrel%20Rise&q=Flat&page=2&pageSize=10", 60);
    const group = await screen.findByRole("group", { name: "Export homes in this list" });
    const csv = new URL(within(group).getByRole("link", { name: /CSV/ }).getAttribute("href")!, "http://x");
    expect(csv.pathname).toBe("/api/properties/export");
    expect(Object.fromEntries(csv.searchParams)).toEqual({ q: "Flat", estate: "Kestrel Rise", format: "csv" });
    const xlsx = new URL(within(group).getByRole("link", { name: /Excel/ }).getAttribute("href")!, "http://x");
    expect(xlsx.searchParams.get("format")).toBe("xlsx");
    expect(within(group).getByRole("link", { name: /Excel/ })).toHaveAttribute("download");
  });

  it("says when nothing matches", async () => {
    setup("/homes?q=nowhere", 0);
    expect(await screen.findByText("No homes match")).toBeInTheDocument();
    expect(screen.getByText("No homes")).toBeInTheDocument();
  });
});
