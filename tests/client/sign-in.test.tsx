import { screen, within } from "@testing-library/react";
import userEvent from "@testing-library/user-event";
import { beforeEach, describe, expect, it } from "vitest";
import { clearCsrfToken } from "@/lib/api-client";
import { apiError, mockApi, propertyPage, unauthenticated, users } from "./support/api-mock";
import { renderApp } from "./support/render-app";

describe("sign-in page", () => {
  beforeEach(() => clearCsrfToken());

  it("checks the fields before sending anything", async () => {
    const { callsTo } = mockApi({ "GET /api/auth/me": unauthenticated });
    renderApp("/sign-in");
    const user = userEvent.setup();

    expect(await screen.findByRole("heading", { level: 1, name: "Sign in" })).toBeInTheDocument();
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    const email = screen.getByLabelText("E-mail address");
    expect(email).toHaveAccessibleDescription("Enter your e-mail address.");
    expect(email).toBeInvalid();
    expect(screen.getByLabelText("Password")).toHaveAccessibleDescription("Enter your password.");

    await user.type(email, "not-an-address");
    await user.click(screen.getByRole("button", { name: "Sign in" }));
    expect(email).toHaveAccessibleDescription("Enter a valid e-mail address, like name@example.org.");
    expect(callsTo("POST", "/api/auth/login")).toHaveLength(0);
  });

  it("shows the server's message when the e-mail and password do not match", async () => {
    const message = "That e-mail address and password do not match an active account.";
    const { callsTo } = mockApi({
      "GET /api/auth/me": unauthenticated,
      "GET /api/auth/csrf": { body: { csrfToken: "pre-login" } },
      "POST /api/auth/login": apiError(401, "invalid_credentials", message),
    });
    renderApp("/sign-in");
    const user = userEvent.setup();

    await user.type(await screen.findByLabelText("E-mail address"), "officer@example.org");
    await user.type(screen.getByLabelText("Password"), "wrong password");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    const alert = await screen.findByRole("alert");
    expect(alert).toHaveTextContent(message);
    const [login] = callsTo("POST", "/api/auth/login");
    expect(login!.body).toEqual({ email: "officer@example.org", password: "wrong password" });
    expect(login!.headers.get("X-CSRF-Token")).toBe("pre-login");
    expect(screen.getByRole("heading", { level: 1, name: "Sign in" })).toBeInTheDocument();
  });

  it("asks for a short wait after too many attempts and offers an e-mailed link to skip the wait", async () => {
    const wait =
      "There have been several unsuccessful attempts to sign in to this account, so we ask for a short wait between tries. Please wait 30 seconds and try again.";
    const sent = "If an active account uses that address, we have sent it a link. Open it in this browser, then sign in.";
    const { callsTo } = mockApi({
      "GET /api/auth/me": unauthenticated,
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "POST /api/auth/login": apiError(429, "too_many_requests", wait, { retryAfterSeconds: 30 }),
      "POST /api/auth/sign-in-unlock/request": { status: 202, body: { message: sent } },
    });
    renderApp("/sign-in");
    const user = userEvent.setup();

    await user.type(await screen.findByLabelText("E-mail address"), "officer@example.org");
    await user.type(screen.getByLabelText("Password"), "guess");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    const alert = await screen.findByRole("alert");
    expect(alert).toHaveTextContent("Please wait 30 seconds and try again.");
    await user.click(within(alert).getByRole("button", { name: "E-mail me a link to skip the wait" }));
    expect(await within(alert).findByRole("status")).toHaveTextContent(sent);
    expect(callsTo("POST", "/api/auth/sign-in-unlock/request")[0]!.body).toEqual({ email: "officer@example.org" });
  });

  it("opens an e-mailed sign-in link only when asked, then points to sign-in", async () => {
    const { callsTo } = mockApi({
      "GET /api/auth/me": unauthenticated,
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "POST /api/auth/sign-in-unlock": { status: 204 },
    });
    const token = "a".repeat(43);
    renderApp(`/unlock-sign-in/${token}`);
    const user = userEvent.setup();

    await user.click(await screen.findByRole("button", { name: "Let me sign in in this browser" }));
    const done = await screen.findByRole("status");
    expect(done).toHaveTextContent("You can sign in now");
    expect(callsTo("POST", "/api/auth/sign-in-unlock")[0]!.body).toEqual({ token });
    expect(within(done).getByRole("link", { name: "Sign in" })).toHaveAttribute("href", "/sign-in");
  });

  it("signs in, keeps the new CSRF token and returns to the page that asked for it", async () => {
    let signedIn = false;
    const { callsTo } = mockApi({
      "GET /api/auth/me": () => (signedIn ? { body: users.officer } : unauthenticated),
      "GET /api/auth/csrf": { body: { csrfToken: "pre-login" } },
      "POST /api/auth/login": () => {
        signedIn = true;
        return { body: { user: users.officer, csrfToken: "post-login" } };
      },
      "POST /api/auth/logout": { status: 204 },
      "GET /api/properties": (call) => ({ body: propertyPage(call.search) }),
      "GET /api/properties/estates": { body: { estates: ["Kestrel Rise"] } },
    });
    const { router } = renderApp("/homes?page=2");
    const user = userEvent.setup();

    // Sent to sign in first, then back to the page it wanted.
    expect(await screen.findByRole("heading", { level: 1, name: "Sign in" })).toBeInTheDocument();
    expect(router.state.location.search).toBe(`?next=${encodeURIComponent("/homes?page=2")}`);
    await user.type(screen.getByLabelText("E-mail address"), "officer@example.org");
    await user.type(screen.getByLabelText("Password"), "dewline-demo");
    await user.click(screen.getByRole("button", { name: "Sign in" }));

    expect(await screen.findByRole("heading", { level: 1, name: "Homes" })).toBeInTheDocument();
    expect(router.state.location.pathname + router.state.location.search).toBe("/homes?page=2");
    const banner = screen.getByRole("banner");
    expect(within(banner).getByText("Priya Venn")).toBeInTheDocument();
    expect(within(banner).getByText("Housing officer")).toBeInTheDocument();

    // Sign out uses the token from the sign-in response, then forgets it.
    await user.click(within(banner).getByRole("button", { name: "Sign out" }));
    expect(await screen.findByRole("heading", { level: 1, name: "Sign in" })).toBeInTheDocument();
    expect(callsTo("POST", "/api/auth/logout")[0]!.headers.get("X-CSRF-Token")).toBe("post-login");
    expect(screen.getByText("You have signed out.")).toBeInTheDocument();
  });

  it("links to the forgotten-password page", async () => {
    mockApi({ "GET /api/auth/me": unauthenticated });
    renderApp("/sign-in");
    const user = userEvent.setup();
    await user.click(await screen.findByRole("link", { name: "Forgot your password?" }));
    expect(await screen.findByRole("heading", { level: 1, name: "Forgotten your password?" })).toBeInTheDocument();
  });
});
