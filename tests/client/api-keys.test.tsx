// The admin's Integrations page: keys listed without their secrets, a new key's secret shown once,
// and a key revoked only after a confirmation.
import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { mockApi, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const hms = {
  id: 7,
  name: "Housing system",
  scopes: ["homes:read", "homes:write"],
  hint: "dwk_7_…",
  createdAt: "2026-01-10T08:00:00.000Z",
  createdBy: { id: 1, name: "Ada Admin" },
  lastUsedAt: null,
  revokedAt: null,
} as const;
const SECRET = `dwk_8_${"a".repeat(43)}`;

function setup(keys: readonly object[] = [hms]) {
  const api = mockApi({
    "GET /api/auth/me": { body: users.admin },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/integrations/api-keys": { body: { keys } },
    "GET /api/integrations/api-keys/audit": { body: { entries: [] } },
    "POST /api/integrations/api-keys": {
      status: 201,
      body: { ...hms, id: 8, name: "Repairs contractor", scopes: ["works:read"], hint: "dwk_8_…", secret: SECRET },
    },
    "POST /api/integrations/api-keys/7/revoke": { body: { ...hms, revokedAt: "2026-01-11T09:00:00.000Z" } },
  });
  return { ...api, ...renderApp("/admin/integrations") };
}

describe("the admin's API keys", () => {
  beforeEach(() => clearCsrfToken());

  it("creates a key with the scopes chosen and shows its secret once", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    const table = await screen.findByRole("table", { name: "API keys" });
    expect(within(table).getByText("Housing system")).toBeInTheDocument();
    expect(within(table).getByText("Never")).toBeInTheDocument();

    await user.click(screen.getByRole("button", { name: "Create key" }));
    expect(await screen.findByText("Choose at least one thing the key may do.")).toBeInTheDocument();
    expect(callsTo("POST", "/api/integrations/api-keys")).toHaveLength(0);

    await user.type(screen.getByRole("textbox", { name: /Name/ }), "Repairs contractor");
    await user.click(screen.getByRole("checkbox", { name: /Read work orders/ }));
    await user.click(screen.getByRole("button", { name: "Create key" }));
    expect(await screen.findByRole("textbox", { name: "The key" })).toHaveValue(SECRET);
    expect(callsTo("POST", "/api/integrations/api-keys")[0]!.body).toEqual({
      name: "Repairs contractor",
      scopes: ["works:read"],
    });

    await user.click(screen.getByRole("button", { name: "I have stored it" }));
    expect(screen.queryByDisplayValue(SECRET)).toBeNull();
  });

  it("revokes a key only after the confirmation", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    await user.click(await screen.findByRole("button", { name: "Revoke the key Housing system" }));
    const dialog = await screen.findByRole("dialog", { name: 'Revoke "Housing system"?' });
    await user.click(within(dialog).getByRole("button", { name: "Cancel" }));
    expect(callsTo("POST", "/api/integrations/api-keys/7/revoke")).toHaveLength(0);

    await user.click(screen.getByRole("button", { name: "Revoke the key Housing system" }));
    await user.click(within(await screen.findByRole("dialog")).getByRole("button", { name: "Revoke the key" }));
    await expect.poll(() => callsTo("POST", "/api/integrations/api-keys/7/revoke").length).toBe(1);
  });

  it("says so when there are no keys yet", async () => {
    setup([]);
    expect(await screen.findByText("No API keys yet")).toBeInTheDocument();
  });
});
