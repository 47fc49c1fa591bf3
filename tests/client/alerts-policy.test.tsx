import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { DEFAULT_SENSOR_ALERT_SETTINGS } from "@/lib/domain/sensor-alerts";
import { sensorAlertPolicySchema } from "../../server/modules/policy/policy.schemas";
import { parse } from "../../server/lib/validation";
import { ValidationError } from "../../server/lib/errors";
import { apiError, mockApi, users, type MockReply } from "./support/api-mock";
import { renderApp } from "./support/render-app";

/** /api/policy/sensor-alerts, checking a PUT with the server's own schema (its real messages). */
function setup() {
  let own: typeof DEFAULT_SENSOR_ALERT_SETTINGS | null = null;
  const view = (): MockReply => ({ body: { ...(own ?? DEFAULT_SENSOR_ALERT_SETTINGS), source: own ? "landlord" : "default" } });
  const api = mockApi({
    "GET /api/auth/me": { body: users.admin },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/policy/sensor-alerts": () => view(),
    "PUT /api/policy/sensor-alerts": (call) => {
      try {
        own = parse(sensorAlertPolicySchema, call.body);
      } catch (e) {
        if (e instanceof ValidationError) return apiError(400, e.code, e.message, e.details);
        throw e;
      }
      return view();
    },
  });
  return { ...api, ...renderApp("/admin/policy") };
}

describe("the sensor alert rules on the policy page", () => {
  beforeEach(() => clearCsrfToken());

  it("shows our defaults as ours, refuses an impossible value with the server's reason, and saves", async () => {
    const { callsTo } = setup();
    const panel = (await screen.findByRole("heading", { name: "Sensor alerts" })).closest("section")!;
    expect(await within(panel).findByText("Our default rules are in force")).toBeInTheDocument();
    expect(within(panel).getByText(/our own choice, not a standard/)).toBeInTheDocument();
    const hours = within(panel).getByRole("textbox", { name: /Hours at 80 % surface humidity/ });
    expect(hours).toHaveValue("72");

    await userEvent.clear(hours);
    await userEvent.type(hours, "200");
    await userEvent.click(within(panel).getByRole("button", { name: "Save the alert rules" }));
    expect(await within(panel).findByText(/must be at most 168 hours/)).toBeInTheDocument();

    await userEvent.clear(hours);
    await userEvent.type(hours, "48");
    await userEvent.click(within(panel).getByRole("button", { name: "Save the alert rules" }));
    expect(await within(panel).findByText("Your own rules are in force")).toBeInTheDocument();
    await waitFor(() => expect(callsTo("PUT", "/api/policy/sensor-alerts").at(-1)!.body).toMatchObject({ hoursAt80In7Days: 48 }));
  });
});
