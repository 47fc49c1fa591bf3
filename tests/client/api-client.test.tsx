import { beforeEach, describe, expect, it } from "vitest";
import { ApiError, api, clearCsrfToken, errorMessage, setCsrfToken } from "@/lib/api-client";
import { apiError, mockApi } from "./support/api-mock";

describe("api client", () => {
  beforeEach(() => clearCsrfToken());

  it("asks for the page's language (<html lang>), so the server writes a tenant's errors in it", async () => {
    const { callsTo } = mockApi({ "GET /api/users": { body: { items: [], total: 0, page: 1, pageSize: 25 } } });
    const before = document.documentElement.lang;
    try {
      document.documentElement.lang = "cy";
      await api.get("/users");
      document.documentElement.lang = "en-GB";
      await api.get("/users");
    } finally {
      document.documentElement.lang = before;
    }
    expect(callsTo("GET", "/api/users").map((c) => c.headers.get("Accept-Language"))).toEqual(["cy", "en-GB"]);
  });

  it("fetches the CSRF token once and sends it on every state-changing request", async () => {
    const { callsTo } = mockApi({
      "GET /api/auth/csrf": { body: { csrfToken: "token-1" } },
      "PATCH /api/users/7": {
        body: {
          id: 7,
          email: "dale@example.org",
          name: "Dale Whitcombe",
          role: "maintenance",
          status: "disabled",
          lastSignInAt: null,
          createdAt: "2026-01-04T10:00:00.000Z",
        },
      },
      "GET /api/users": { body: { items: [], total: 0, page: 1, pageSize: 25 } },
    });

    await api.get("/users");
    await api.patch("/users/7", { status: "disabled" });
    await api.patch("/users/7", { status: "disabled" });

    expect(callsTo("GET", "/api/auth/csrf")).toHaveLength(1);
    const [getUsers] = callsTo("GET", "/api/users");
    expect(getUsers!.headers.get("X-CSRF-Token")).toBeNull();
    for (const call of callsTo("PATCH", "/api/users/7")) {
      expect(call.headers.get("X-CSRF-Token")).toBe("token-1");
      expect(call.body).toEqual({ status: "disabled" });
    }
  });

  it("refetches the token and retries once when the server says it is invalid", async () => {
    let issued = 0;
    const { callsTo } = mockApi({
      "GET /api/auth/csrf": () => ({ body: { csrfToken: `token-${++issued}` } }),
      "POST /api/auth/invitations": (call) =>
        call.headers.get("X-CSRF-Token") === "token-2"
          ? { status: 201, body: { expiresAt: "2026-01-04T10:00:00.000Z" } }
          : apiError(
              403,
              "csrf_invalid",
              "The security token of this request is missing or out of date. Reload the page and try again.",
            ),
    });

    const result = await api.post("/auth/invitations", { email: "a@example.org", name: "A", role: "officer" });

    expect(result).toEqual({ expiresAt: "2026-01-04T10:00:00.000Z" });
    expect(callsTo("GET", "/api/auth/csrf")).toHaveLength(2);
    expect(callsTo("POST", "/api/auth/invitations").map((c) => c.headers.get("X-CSRF-Token"))).toEqual(["token-1", "token-2"]);
  });

  it("retries only once: a second csrf_invalid reaches the caller as an ApiError", async () => {
    const { callsTo } = mockApi({
      "GET /api/auth/csrf": { body: { csrfToken: "stale" } },
      "POST /api/auth/logout": apiError(403, "csrf_invalid", "The security token of this request is missing or out of date."),
    });

    const error = await api.post("/auth/logout").catch((e: unknown) => e);

    expect(error).toBeInstanceOf(ApiError);
    expect(error).toMatchObject({ status: 403, code: "csrf_invalid" });
    expect(callsTo("POST", "/api/auth/logout")).toHaveLength(2);
  });

  it("does not retry other 403s", async () => {
    const { callsTo } = mockApi({
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "PATCH /api/users/1": apiError(403, "role_not_allowed", "Your account is not allowed to use this part of Dewline."),
    });
    await expect(api.patch("/users/1", { status: "active" })).rejects.toMatchObject({ code: "role_not_allowed" });
    expect(callsTo("PATCH", "/api/users/1")).toHaveLength(1);
  });

  it("uses a token handed over by sign-in, and fetches a new one after it is dropped", async () => {
    const { callsTo } = mockApi({
      "GET /api/auth/csrf": { body: { csrfToken: "fresh" } },
      "POST /api/auth/logout": { status: 204 },
    });

    setCsrfToken("from-login");
    await api.post("/auth/logout");
    clearCsrfToken();
    await api.post("/auth/logout");

    expect(callsTo("POST", "/api/auth/logout").map((c) => c.headers.get("X-CSRF-Token"))).toEqual(["from-login", "fresh"]);
  });

  it("turns the server's error shape into an ApiError with status, code, message and details", async () => {
    const details = [{ field: "email", message: "Enter a valid e-mail address, like name@example.org." }];
    mockApi({
      "GET /api/auth/csrf": { body: { csrfToken: "t" } },
      "POST /api/auth/password-reset": apiError(
        400,
        "validation_failed",
        "email: Enter a valid e-mail address, like name@example.org.",
        details,
      ),
    });

    const error = (await api.post("/auth/password-reset", { email: "nope" }).catch((e: unknown) => e)) as ApiError;

    expect(error).toBeInstanceOf(ApiError);
    expect(error.status).toBe(400);
    expect(error.code).toBe("validation_failed");
    expect(error.fieldErrors).toEqual(details);
    expect(errorMessage(error)).toBe("Enter a valid e-mail address, like name@example.org.");
  });

  it("reports a network failure in plain words", async () => {
    mockApi({});
    globalThis.fetch = (async () => {
      throw new TypeError("Failed to fetch");
    }) as typeof fetch;
    await expect(api.get("/auth/me")).rejects.toMatchObject({ status: 0, code: "network_error" });
  });

  describe("Idempotency-Key on POSTs", () => {
    const MESSAGES = "/api/cases/5/messages";
    const sent = { status: 201, body: { ok: true, id: 41 } };
    const unavailable = apiError(503, "service_unavailable", "The database is not answering. Please try again.");

    it("sends a fresh key with each POST call, and none with other methods", async () => {
      const { callsTo } = mockApi({
        "GET /api/auth/csrf": { body: { csrfToken: "token-1" } },
        [`POST ${MESSAGES}`]: sent,
        "PATCH /api/users/7": {
          body: {
            id: 7,
            email: "dale@example.org",
            name: "Dale Whitcombe",
            role: "maintenance",
            status: "disabled",
            lastSignInAt: null,
            createdAt: "2026-01-04T10:00:00.000Z",
          },
        },
      });
      await api.post("/cases/5/messages", { body: "First" });
      await api.post("/cases/5/messages", { body: "Second" });
      await api.patch("/users/7", { status: "disabled" });

      const keys = callsTo("POST", MESSAGES).map((c) => c.headers.get("Idempotency-Key"));
      expect(keys).toHaveLength(2);
      for (const key of keys) expect(key).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
      expect(keys[0]).not.toBe(keys[1]);
      expect(callsTo("PATCH", "/api/users/7")[0]!.headers.get("Idempotency-Key")).toBeNull();
    });

    it("sends the same POST again with the same key after a 503, and gives its answer", async () => {
      const { callsTo } = mockApi({
        "GET /api/auth/csrf": { body: { csrfToken: "token-1" } },
        [`POST ${MESSAGES}`]: (_call, nth) => (nth === 0 ? unavailable : sent),
      });
      await expect(api.post("/cases/5/messages", { body: "During a failover" })).resolves.toEqual({ ok: true, id: 41 });
      const calls = callsTo("POST", MESSAGES);
      expect(calls).toHaveLength(2);
      expect(calls[1]!.headers.get("Idempotency-Key")).toBe(calls[0]!.headers.get("Idempotency-Key"));
      expect(calls[1]!.body).toEqual({ body: "During a failover" });
    });

    it("sends it again with the same key after a network failure", async () => {
      const { fetchMock } = mockApi({
        "GET /api/auth/csrf": { body: { csrfToken: "token-1" } },
        [`POST ${MESSAGES}`]: sent,
      });
      const answer = fetchMock.getMockImplementation()!;
      const keys: (string | null)[] = [];
      fetchMock.mockImplementation(async (input, init) => {
        if (init?.method === "POST") {
          keys.push(new Headers(init.headers).get("Idempotency-Key"));
          // The first try never reaches the server (the connection drops).
          if (keys.length === 1) throw new TypeError("Failed to fetch");
        }
        return answer(input, init);
      });
      await expect(api.post("/cases/5/messages", { body: "On a train" })).resolves.toEqual({ ok: true, id: 41 });
      expect(keys).toHaveLength(2);
      expect(keys[0]).toBeTruthy();
      expect(keys[1]).toBe(keys[0]);
    });

    it("tries three times in all, then reports the last failure", async () => {
      const { callsTo } = mockApi({
        "GET /api/auth/csrf": { body: { csrfToken: "token-1" } },
        [`POST ${MESSAGES}`]: unavailable,
      });
      await expect(api.post("/cases/5/messages", { body: "Still down" })).rejects.toMatchObject({
        status: 503,
        code: "service_unavailable",
      });
      expect(new Set(callsTo("POST", MESSAGES).map((c) => c.headers.get("Idempotency-Key"))).size).toBe(1);
      expect(callsTo("POST", MESSAGES)).toHaveLength(3);
    });

    it("does not resend after a 500 or a 409: the server has answered", async () => {
      const { callsTo } = mockApi({
        "GET /api/auth/csrf": { body: { csrfToken: "token-1" } },
        [`POST ${MESSAGES}`]: apiError(409, "already_applied", "This was already saved. Refresh to see the result."),
        "POST /api/cases/6/messages": apiError(500, "internal", "Something went wrong on our side."),
      });
      await expect(api.post("/cases/5/messages", { body: "Twice" })).rejects.toMatchObject({ code: "already_applied" });
      await expect(api.post("/cases/6/messages", { body: "Broken" })).rejects.toMatchObject({ status: 500 });
      expect(callsTo("POST", MESSAGES)).toHaveLength(1);
      expect(callsTo("POST", "/api/cases/6/messages")).toHaveLength(1);
    });
  });
});
