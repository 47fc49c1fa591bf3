import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { makeProperty, mockApi, propertyPage, unauthenticated, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const myHome = {
  tenancy: { id: 4, startDate: "2021-04-12", endDate: null },
  property: {
    ...makeProperty(5, {
      addressLine1: "1 Tanner Row",
      addressLine2: null,
      postcode: "ZX3 1AA",
      estate: "Millbeck Terraces",
      block: null,
    }),
    rooms: [
      { id: 1, name: "Living room", kind: "living" },
      { id: 2, name: "Box room", kind: "bedroom" },
    ],
  },
};

describe("route guards", () => {
  beforeEach(() => clearCsrfToken());

  it("shows a tenant 'Not allowed' at /queue, with a link to their own home screen", async () => {
    const { callsTo } = mockApi({ "GET /api/auth/me": { body: users.tenant }, "GET /api/me/home": { body: myHome } });
    const { router } = renderApp("/queue");

    expect(await screen.findByRole("heading", { level: 1, name: "Not allowed" })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe("/queue");
    expect(screen.getByText(/your account cannot open this page/i)).toBeInTheDocument();
    // Nothing the tenant may not see was even asked for.
    expect(callsTo("GET", "/api/properties")).toHaveLength(0);

    const user = userEvent.setup();
    await user.click(screen.getByRole("link", { name: "Go to My home" }));
    expect(await screen.findByRole("heading", { level: 1, name: "My home" })).toBeInTheDocument();
    expect(await screen.findByText("Millbeck Terraces")).toBeInTheDocument();
    expect(screen.getByText("Box room")).toBeInTheDocument();
    expect(screen.getByText("12 April 2021")).toBeInTheDocument();
  });

  it("sends a signed-out visitor to sign in", async () => {
    mockApi({ "GET /api/auth/me": unauthenticated });
    const { router } = renderApp("/admin");
    expect(await screen.findByRole("heading", { level: 1, name: "Sign in" })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe("/sign-in");
    expect(new URLSearchParams(router.state.location.search).get("next")).toBe("/admin");
  });

  it.each([
    ["tenant", "/home", "My home"],
    ["officer", "/queue", "Case queue"],
    ["maintenance", "/works", "Works"],
    ["admin", "/admin", "Users and invitations"],
  ] as const)("sends a %s from / to %s", async (role, path, heading) => {
    mockApi({
      "GET /api/auth/me": { body: users[role] },
      "GET /api/me/home": { body: myHome },
      "GET /api/properties": (call) => ({ body: propertyPage(call.search, 3) }),
      "GET /api/properties/estates": { body: { estates: ["Kestrel Rise"] } },
      "GET /api/users": { body: { items: [], total: 0, page: 1, pageSize: 25 } },
    });
    const { router } = renderApp("/");
    expect(await screen.findByRole("heading", { level: 1, name: heading })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe(path);
    const nav = screen.getByRole("navigation", { name: "Main" });
    expect(within(nav).getByRole("link", { name: heading })).toHaveAttribute("aria-current", "page");
  });

  it("shows 'Page not found' for an unknown address, signed in or not", async () => {
    mockApi({ "GET /api/auth/me": unauthenticated });
    renderApp("/no/such/page");
    expect(await screen.findByRole("heading", { level: 1, name: "Page not found" })).toBeInTheDocument();
    expect(screen.getByRole("link", { name: "Go to the start page" })).toHaveAttribute("href", "/");
  });

  it("lets anyone open the calculator", async () => {
    mockApi({ "GET /api/auth/me": unauthenticated });
    renderApp("/calculator");
    expect(
      await screen.findByRole("heading", { level: 1, name: "Dew point and surface humidity calculator" }),
    ).toBeInTheDocument();
  });

  it("has a skip link and the landmarks", async () => {
    mockApi({ "GET /api/auth/me": { body: users.tenant }, "GET /api/me/home": { body: myHome } });
    renderApp("/home");
    await screen.findByRole("heading", { level: 1, name: "My home" });
    expect(screen.getByRole("link", { name: "Skip to main content" })).toHaveAttribute("href", "#main");
    expect(screen.getByRole("banner")).toBeInTheDocument();
    expect(screen.getByRole("main")).toHaveAttribute("id", "main");
    expect(screen.getByRole("navigation", { name: "Main" })).toBeInTheDocument();
  });

  it("says so kindly when a tenant has no current tenancy", async () => {
    const message = "We could not find a current tenancy for your account. Please contact your landlord.";
    mockApi({
      "GET /api/auth/me": { body: users.tenant },
      "GET /api/me/home": { status: 404, body: { error: { code: "not_found", message } } },
    });
    renderApp("/home");
    expect(await screen.findByText(message)).toBeInTheDocument();
  });
});
