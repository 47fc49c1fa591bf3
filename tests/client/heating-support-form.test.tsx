// The admin's "Help with heating costs" section on the policy page: saying what is in force, refusing a
// bad number with the server's own reason (its real schema), and saving the landlord's route.
import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { heatingSupportSchema, type HeatingSupportInput } from "@/lib/schemas/policy";
import { parse } from "../../server/lib/validation";
import { ValidationError } from "../../server/lib/errors";
import { apiError, mockApi, users, type MockReply } from "./support/api-mock";
import { renderApp } from "./support/render-app";

function setup() {
  let own: HeatingSupportInput | null = null;
  const view = (): MockReply => ({
    body: own ? { ...own, source: "landlord" } : { supportText: null, supportPhone: null, supportLink: null, source: "default" },
  });
  const api = mockApi({
    "GET /api/auth/me": { body: users.admin },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/policy/heating-support": () => view(),
    "PUT /api/policy/heating-support": (call) => {
      try {
        own = parse(heatingSupportSchema, call.body);
      } catch (e) {
        if (e instanceof ValidationError) return apiError(400, e.code, e.message, e.details);
        throw e;
      }
      return view();
    },
  });
  return { ...api, ...renderApp("/admin/policy") };
}

describe("help with heating costs on the policy page", () => {
  beforeEach(() => clearCsrfToken());

  it("says none is set, refuses a bad number with the server's reason, and saves the route", async () => {
    const { callsTo } = setup();
    const panel = (await screen.findByRole("heading", { name: "Help with heating costs" })).closest("section")!;
    expect(await within(panel).findByText("No route set yet")).toBeInTheDocument();
    await userEvent.type(within(panel).getByRole("textbox", { name: "What help you offer" }), "Our money team can help.");
    const phone = within(panel).getByRole("textbox", { name: /Telephone number/ });
    await userEvent.type(phone, "12");
    await userEvent.click(within(panel).getByRole("button", { name: "Save the heating support route" }));
    expect(await within(panel).findByText(/Enter a UK telephone number/)).toBeInTheDocument();

    await userEvent.clear(phone);
    await userEvent.type(phone, "0300 123 4567");
    await userEvent.click(within(panel).getByRole("button", { name: "Save the heating support route" }));
    expect(await within(panel).findByText("Your own route is shown")).toBeInTheDocument();
    await waitFor(() =>
      expect(callsTo("PUT", "/api/policy/heating-support").at(-1)!.body).toMatchObject({
        supportText: "Our money team can help.",
        supportPhone: "0300 123 4567",
      }),
    );
  });
});
