import { screen, waitFor, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY, type DeadlinePolicy } from "@/lib/domain/deadlines";
import { clearCsrfToken } from "@/lib/api-client";
import { ENGLAND_DEFAULT, POLICY_FIELDS } from "@/features/policy/api/types";
import { deadlinePolicySchema } from "../../server/modules/policy/policy.schemas";
import { DEFAULT_MONITORING_DAYS } from "../../server/modules/policy/policy.service";
import { parse } from "../../server/lib/validation";
import { ValidationError } from "../../server/lib/errors";
import { apiError, mockApi, users, type MockReply } from "./support/api-mock";
import { COMPLAINT_HANDLING_DEFAULT_POLICY } from "@/lib/domain/complaint-clocks";
import {
  COMPLAINT_LETTER_KINDS,
  COMPLAINT_LETTER_PLACEHOLDERS,
  DEFAULT_COMPLAINT_LETTERS,
  DEFAULT_ESCALATION_ROUTE,
} from "@/lib/domain/complaint-letters";

/** The complaint policy section below the timeframes: the default in force. */
const COMPLAINT_POLICY = {
  ...COMPLAINT_HANDLING_DEFAULT_POLICY,
  escalationRoute: DEFAULT_ESCALATION_ROUTE,
  letters: COMPLAINT_LETTER_KINDS.map((kind) => ({ kind, ...DEFAULT_COMPLAINT_LETTERS[kind], source: "default" })),
  placeholders: Object.entries(COMPLAINT_LETTER_PLACEHOLDERS).map(([name, meaning]) => ({ name, meaning })),
  source: "default",
};
import { renderApp } from "./support/render-app";
import { DEFAULT_SENSOR_ALERT_SETTINGS } from "@/lib/domain/sensor-alerts";

const DEFAULT = { ...ENGLAND_SOCIAL_HOUSING_DEFAULT_POLICY, monitoringDays: DEFAULT_MONITORING_DAYS };

/**
 * A stand-in for /api/policy that keeps the landlord's timeframes between calls and checks a PUT
 * body with the server's own schema and parser, so the 400 replies carry the server's real messages.
 */
function setup(start: DeadlinePolicy | null = null, role: keyof typeof users = "admin") {
  let own: (DeadlinePolicy & { emergencyPhone?: string | null }) | null = start;
  const view = (): MockReply => ({
    body: own ? { emergencyPhone: null, ...own, source: "landlord" } : { ...DEFAULT, emergencyPhone: null, source: "default" },
  });
  const api = mockApi({
    "GET /api/auth/me": { body: users[role] },
    "GET /api/auth/csrf": { body: { csrfToken: "t" } },
    "GET /api/policy": () => view(),
    "GET /api/policy/complaints": { body: COMPLAINT_POLICY },
    "GET /api/policy/sensor-alerts": { body: { ...DEFAULT_SENSOR_ALERT_SETTINGS, source: "default" } },
    "GET /api/policy/heating-support": { body: { supportText: null, supportPhone: null, supportLink: null, source: "default" } },
    "PUT /api/policy": (call) => {
      try {
        own = parse(deadlinePolicySchema, call.body);
      } catch (e) {
        if (e instanceof ValidationError) return apiError(400, e.code, e.message, e.details);
        throw e;
      }
      return view();
    },
    "DELETE /api/policy": () => {
      own = null;
      return view();
    },
  });
  return { ...api, ...renderApp("/admin/policy") };
}

const field = (label: RegExp) => screen.getByRole("textbox", { name: label });

describe("the deadline policy page", () => {
  beforeEach(() => clearCsrfToken());

  it("shows the England default in force, each timeframe explained, and how working days count", async () => {
    setup();
    expect(await screen.findByRole("heading", { level: 1, name: "Deadline policy" })).toBeInTheDocument();
    expect(await screen.findByText("The England default is in force")).toBeInTheDocument();
    expect(field(/Make the home safe within/)).toHaveValue("24");
    expect(field(/^Investigate within/)).toHaveValue("10");
    expect(field(/Written summary within/)).toHaveValue("3");
    expect(field(/Safety work begun within/)).toHaveValue("5");
    expect(field(/Further work begun within/)).toHaveValue("12");
    expect(field(/Check the fix for/)).toHaveValue("21");
    expect(field(/Make the home safe within/)).toHaveAccessibleDescription(
      /emergency hazard.*England default: 24 hours\. From 1 to 72 hours\./,
    );
    expect(field(/Further work begun within/)).toHaveAccessibleDescription(/England default: 12 weeks/);
    expect(screen.getByText(/deadlines of every open case follow this policy/)).toBeInTheDocument();
    expect(
      screen.getByText(/Working days leave out Saturdays, Sundays and bank holidays in England and Wales/),
    ).toBeInTheDocument();
    // Nothing to go back to while the default is in force.
    expect(screen.queryByRole("button", { name: "Go back to the England default" })).not.toBeInTheDocument();

    const nav = screen.getByRole("navigation", { name: "Main" });
    expect(within(nav).getByRole("link", { name: "Deadline policy" })).toHaveAttribute("aria-current", "page");
    expect(within(nav).getByRole("link", { name: "Users and invitations" })).not.toHaveAttribute("aria-current");
  });

  it("shows the server's message beside a timeframe it refuses, then saves the landlord's own", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    const hours = await screen.findByRole("textbox", { name: /Make the home safe within/ });
    await user.clear(hours);
    await user.type(hours, "100");
    await user.click(screen.getByRole("button", { name: "Save" }));

    // The server's own limit (72 hours), shown at the field; nothing is saved.
    await waitFor(() => expect(hours).toHaveAccessibleDescription(/Must be at most 72 hours\./));
    // Two alerts: the form's and the field's own (field errors are announced as they appear).
    expect(screen.getAllByRole("alert").map((a) => a.textContent)).toEqual([
      expect.stringContaining("Your timeframes were not saved"),
      expect.stringContaining("Must be at most 72 hours."),
    ]);
    expect(hours).toHaveAttribute("aria-invalid", "true");
    expect(screen.getByText("The England default is in force")).toBeInTheDocument();

    await user.clear(hours);
    await user.type(hours, "12");
    const investigate = field(/^Investigate within/);
    await user.clear(investigate);
    await user.type(investigate, "7");
    await user.click(screen.getByRole("button", { name: "Save" }));

    expect(await screen.findByText(/^Saved\. Your own timeframes are in force/)).toBeInTheDocument();
    expect(screen.getByText("Your own timeframes are in force")).toBeInTheDocument();
    expect(callsTo("PUT", "/api/policy")).toHaveLength(2);
    expect(callsTo("PUT", "/api/policy").at(-1)!.body).toEqual({
      ...DEFAULT,
      emergencyMakeSafeHours: 12,
      investigateWorkingDays: 7,
      emergencyPhone: null,
    });
    expect(field(/Make the home safe within/)).toHaveValue("12");
    expect(field(/Make the home safe within/)).not.toHaveAttribute("aria-invalid");
  });

  it("says the unit in the singular for a limit of one: 'at least 1 hour', never '1 hours'", async () => {
    setup();
    const user = userEvent.setup();
    const hours = await screen.findByRole("textbox", { name: /Make the home safe within/ });
    await user.clear(hours);
    await user.type(hours, "0");
    const supplementary = field(/Further work begun within/);
    await user.clear(supplementary);
    await user.type(supplementary, "0");
    await user.click(screen.getByRole("button", { name: "Save" }));
    await waitFor(() => expect(hours).toHaveAccessibleDescription(/Must be at least 1 hour\./));
    expect(hours).not.toHaveAccessibleDescription(/1 hours/);
    expect(supplementary).toHaveAccessibleDescription(/Must be at least 1 week\./);
    // The plural stays where it belongs.
    await user.clear(hours);
    await user.type(hours, "73");
    await user.click(screen.getByRole("button", { name: "Save" }));
    await waitFor(() => expect(hours).toHaveAccessibleDescription(/Must be at most 72 hours\./));
  });

  it("takes the landlord's emergency number, refusing one that is not a UK telephone number", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    const phone = await screen.findByRole("textbox", { name: "Emergency telephone number" });
    await user.type(phone, "call us");
    await user.click(screen.getByRole("button", { name: "Save" }));
    await waitFor(() => expect(phone).toHaveAccessibleDescription(/Enter a UK telephone number/));
    expect(phone).toHaveAttribute("aria-invalid", "true");
    expect(callsTo("PUT", "/api/policy")).toHaveLength(0);

    await user.clear(phone);
    await user.type(phone, "0300 123 4567");
    await user.click(screen.getByRole("button", { name: "Save" }));
    expect(await screen.findByText(/^Saved\. Your own timeframes are in force/)).toBeInTheDocument();
    expect(callsTo("PUT", "/api/policy").at(-1)!.body).toMatchObject({ emergencyPhone: "0300 123 4567" });
    expect(screen.getByRole("textbox", { name: "Emergency telephone number" })).toHaveValue("0300 123 4567");
  });

  it("asks for a whole number before sending anything", async () => {
    const { callsTo } = setup();
    const user = userEvent.setup();
    const summary = await screen.findByRole("textbox", { name: /Written summary within/ });
    await user.clear(summary);
    await user.click(screen.getByRole("button", { name: "Save" }));
    expect(summary).toHaveAccessibleDescription(/Enter a number of working days\./);
    await user.type(summary, "2.5");
    await user.click(screen.getByRole("button", { name: "Save" }));
    await waitFor(() => expect(summary).toHaveAccessibleDescription(/Enter a whole number of working days, using digits only\./));
    expect(callsTo("PUT", "/api/policy")).toHaveLength(0);
  });

  it("goes back to the England default only after confirming", async () => {
    const own = { ...DEFAULT, emergencyMakeSafeHours: 12, summaryWorkingDays: 2 };
    const { callsTo } = setup(own);
    const user = userEvent.setup();
    expect(await screen.findByText("Your own timeframes are in force")).toBeInTheDocument();
    expect(field(/Make the home safe within/)).toHaveValue("12");

    await user.click(screen.getByRole("button", { name: "Go back to the England default" }));
    const dialog = await screen.findByRole("dialog", { name: "Go back to the England default?" });
    expect(within(dialog).getByText("Make the home safe within 24 hours")).toBeInTheDocument();
    await user.click(within(dialog).getByRole("button", { name: "Cancel" }));
    expect(callsTo("DELETE", "/api/policy")).toHaveLength(0);
    expect(field(/Make the home safe within/)).toHaveValue("12");

    await user.click(screen.getByRole("button", { name: "Go back to the England default" }));
    await user.click(within(await screen.findByRole("dialog")).getByRole("button", { name: "Go back to the England default" }));

    expect(await screen.findByText(/^The England default is in force again/)).toBeInTheDocument();
    expect(callsTo("DELETE", "/api/policy")).toHaveLength(1);
    expect(screen.getByText("The England default is in force")).toBeInTheDocument();
    expect(field(/Make the home safe within/)).toHaveValue("24");
    expect(field(/Written summary within/)).toHaveValue("3");
    expect(screen.queryByRole("button", { name: "Go back to the England default" })).not.toBeInTheDocument();
  });

  it("is for admins only", async () => {
    const { callsTo } = setup(null, "officer");
    expect(await screen.findByRole("heading", { level: 1, name: "Not allowed" })).toBeInTheDocument();
    expect(callsTo("GET", "/api/policy")).toHaveLength(0);
  });

  it("keeps the page's copy of the default and the limits in step with the domain and the server", () => {
    // The page copies the default so the browser does not load the bank-holiday data.
    expect(ENGLAND_DEFAULT).toEqual(DEFAULT);
    for (const f of POLICY_FIELDS) {
      const at = (n: number) => deadlinePolicySchema.safeParse({ ...DEFAULT, [f.name]: n }).success;
      expect([at(f.min - 1), at(f.min), at(f.max), at(f.max + 1)], f.name).toEqual([false, true, true, false]);
    }
  });
});
