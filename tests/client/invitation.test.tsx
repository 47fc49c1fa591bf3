import { screen } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { apiError, mockApi, unauthenticated } from "./support/api-mock";
import { renderApp } from "./support/render-app";

const token = "a".repeat(43);
const INVALID = "This link is not valid any more: it may have been used already or have expired. Ask for a new one.";

describe("invitation and password reset links", () => {
  beforeEach(() => clearCsrfToken());

  it("greets the person, checks the password and then points to sign in", async () => {
    const { callsTo } = mockApi({
      "GET /api/auth/me": unauthenticated,
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      [`GET /api/auth/invitations/${token}`]: {
        body: { email: "sam@example.org", name: "Sam Newell", organisationName: "Northfold Homes" },
      },
      "POST /api/auth/invitations/accept": { status: 204 },
    });
    renderApp(`/invitation/${token}`);
    const user = userEvent.setup();

    expect(await screen.findByRole("heading", { level: 1, name: "Welcome, Sam Newell" })).toBeInTheDocument();
    expect(screen.getByText(/Northfold Homes has invited you/)).toBeInTheDocument();

    await user.type(screen.getByLabelText("New password"), "short");
    await user.type(screen.getByLabelText("Type the new password again"), "different");
    await user.click(screen.getByRole("button", { name: "Set my password" }));
    expect(screen.getByLabelText("New password")).toHaveAccessibleDescription(/Use at least 10 characters\./);
    expect(screen.getByLabelText("Type the new password again")).toHaveAccessibleDescription(
      "The two passwords are not the same.",
    );
    expect(callsTo("POST", "/api/auth/invitations/accept")).toHaveLength(0);

    await user.clear(screen.getByLabelText("New password"));
    await user.clear(screen.getByLabelText("Type the new password again"));
    await user.type(screen.getByLabelText("New password"), "heron walk tea kettle");
    await user.type(screen.getByLabelText("Type the new password again"), "heron walk tea kettle");
    await user.click(screen.getByRole("button", { name: "Set my password" }));

    expect(await screen.findByRole("link", { name: "Sign in to Dewline" })).toHaveAttribute("href", "/sign-in");
    expect(callsTo("POST", "/api/auth/invitations/accept")[0]!.body).toEqual({ token, password: "heron walk tea kettle" });
  });

  it("shows the server's message for a used or expired invitation", async () => {
    mockApi({ "GET /api/auth/me": unauthenticated, [`GET /api/auth/invitations/${token}`]: apiError(404, "not_found", INVALID) });
    renderApp(`/invitation/${token}`);
    expect(await screen.findByText(INVALID)).toBeInTheDocument();
  });

  it("shows the field message for a malformed link", async () => {
    mockApi({
      "GET /api/auth/me": unauthenticated,
      "GET /api/auth/invitations/bad": apiError(400, "validation_failed", "token: This link is not valid.", [
        { field: "token", message: "This link is not valid." },
      ]),
    });
    renderApp("/invitation/bad");
    expect(await screen.findByText("This link is not valid.")).toBeInTheDocument();
  });

  it("asks for a reset link and always answers the same way", async () => {
    const message = "If an active account uses that address, we have sent it a link to choose a new password.";
    const { callsTo } = mockApi({
      "GET /api/auth/me": unauthenticated,
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "POST /api/auth/password-reset": { status: 202, body: { message } },
    });
    renderApp("/forgot-password");
    const user = userEvent.setup();
    await user.type(await screen.findByLabelText("E-mail address"), "tenant@example.org");
    await user.click(screen.getByRole("button", { name: "Send the link" }));
    expect(await screen.findByText(message)).toBeInTheDocument();
    expect(callsTo("POST", "/api/auth/password-reset")[0]!.body).toEqual({ email: "tenant@example.org" });
  });

  it("sets a new password from a reset link, or says the link is no good", async () => {
    let first = true;
    mockApi({
      "GET /api/auth/me": unauthenticated,
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "POST /api/auth/password-reset/confirm": () => {
        if (first) {
          first = false;
          return apiError(404, "not_found", INVALID);
        }
        return { status: 204 };
      },
    });
    renderApp(`/reset-password/${token}`);
    const user = userEvent.setup();
    expect(await screen.findByRole("heading", { level: 1, name: "Choose a new password" })).toBeInTheDocument();
    await user.type(screen.getByLabelText("New password"), "a much longer password");
    await user.type(screen.getByLabelText("Type the new password again"), "a much longer password");
    await user.click(screen.getByRole("button", { name: "Save new password" }));
    expect(await screen.findByRole("alert")).toHaveTextContent(INVALID);
    expect(screen.getByRole("link", { name: "Ask for a new link" })).toHaveAttribute("href", "/forgot-password");

    await user.click(screen.getByRole("button", { name: "Save new password" }));
    expect(await screen.findByRole("link", { name: "sign in with your new password" })).toBeInTheDocument();
  });
});
