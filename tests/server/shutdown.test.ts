// The real server entry (server/server.ts, run as its own process as in production) shuts down
// gracefully: on SIGTERM readiness fails at once, then it stops accepting connections, a request
// already in flight still gets its full answer, and the process exits 0.
import { spawn, type ChildProcess } from "node:child_process";
import http from "node:http";
import { afterAll, expect, it } from "vitest";
import { freePort } from "../../scripts/lib/mariadb.js";
import { projectRoot } from "../../scripts/lib/paths.js";

let child: ChildProcess | undefined;
afterAll(() => {
  if (child && child.exitCode === null && child.signalCode === null) child.kill("SIGKILL");
});

interface Answer {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: string;
}

function get(port: number, path: string): Promise<Answer> {
  return new Promise((resolve, reject) => {
    // A new connection each time (agent: false), as a load balancer's probe makes.
    http
      .get({ host: "127.0.0.1", port, path, agent: false }, (res) => {
        let body = "";
        res.setEncoding("utf8");
        res.on("data", (chunk: string) => (body += chunk));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body }));
      })
      .on("error", reject);
  });
}

/** Asks `path` until `accept` says yes; gives up after `tries`. Waits for a state, never a fixed time. */
async function until(port: number, path: string, accept: (a: Answer) => boolean, tries = 300): Promise<Answer> {
  let last: Answer | Error | undefined;
  for (let i = 0; i < tries; i++) {
    try {
      last = await get(port, path);
      if (accept(last)) return last;
    } catch (error) {
      last = error as Error;
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error(`${path} never gave the awaited answer; last: ${last instanceof Error ? last.message : JSON.stringify(last)}`);
}

/** Waits until the server refuses new connections (it has stopped listening). */
async function untilRefused(port: number, tries = 300): Promise<void> {
  for (let i = 0; i < tries; i++) {
    const refused = await get(port, "/api/health/live").then(
      () => false,
      (error: NodeJS.ErrnoException) => error.code === "ECONNREFUSED",
    );
    if (refused) return;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error("the server never stopped accepting connections");
}

it("on SIGTERM turns unready, stops accepting, finishes the request in flight and exits 0", { timeout: 120_000 }, async () => {
  const port = await freePort();
  let output = "";
  child = spawn(process.execPath, ["--import", "tsx", "server/server.ts"], {
    cwd: projectRoot,
    // DB_* point at this run's throwaway MariaDB (tests/setup/server-setup.ts), already migrated.
    env: {
      ...process.env,
      TSX_TSCONFIG_PATH: "server/tsconfig.json",
      NODE_ENV: "test",
      HOST: "127.0.0.1",
      PORT: String(port),
      LOG_LEVEL: "info",
      SMTP_PORT: String(await freePort()),
      // Long enough for the probes below to see "unready" while the server still accepts; the test
      // waits for the states (unready, then refusing), not for this time.
      SHUTDOWN_DELAY_MS: "3000",
      SHUTDOWN_TIMEOUT_MS: "30000",
    },
    stdio: ["ignore", "pipe", "pipe"],
  });
  child.stdout?.on("data", (d: Buffer) => (output += d.toString()));
  child.stderr?.on("data", (d: Buffer) => (output += d.toString()));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child?.once("exit", (code, signal) => resolve({ code, signal })),
  );

  const ready = await until(port, "/api/health/ready", (a) => a.status === 200, 600).catch((error: Error) => {
    throw new Error(`${error.message}\nserver output:\n${output}`);
  });
  expect(JSON.parse(ready.body)).toEqual({ status: "ready" });
  expect((await get(port, "/api/health/live")).status).toBe(200);

  // A request whose body arrives slowly: the headers go first, and the server's "100 Continue" shows it
  // is already handling the request; the rest of the body is sent only after SIGTERM.
  const body = JSON.stringify({ airTemperatureC: 19, relativeHumidityPct: 78, surfaceTemperatureC: 9 });
  let answer!: Promise<Answer>;
  let markDraining!: () => void;
  const draining = new Promise<void>((r) => (markDraining = r));
  await new Promise<void>((continued, failed) => {
    const req = http.request({
      host: "127.0.0.1",
      port,
      method: "POST",
      path: "/api/psychrometrics/evaluate",
      agent: false,
      headers: { "Content-Type": "application/json", "Content-Length": Buffer.byteLength(body), Expect: "100-continue" },
    });
    answer = new Promise<Answer>((resolve, reject) => {
      req.on("response", (res) => {
        let text = "";
        res.setEncoding("utf8");
        res.on("data", (chunk: string) => (text += chunk));
        res.on("end", () => resolve({ status: res.statusCode ?? 0, headers: res.headers, body: text }));
      });
      req.on("error", reject);
    });
    answer.catch(failed);
    req.on("continue", () => {
      req.write(body.slice(0, 10));
      continued();
      // The rest once the server is draining (below).
      void draining.then(() => req.end(body.slice(10)));
    });
    req.flushHeaders();
  });

  child.kill("SIGTERM");
  const unready = await until(port, "/api/health/ready", (a) => a.status === 503);
  expect(JSON.parse(unready.body)).toMatchObject({ status: "unready", reason: "shutting_down" });
  // Then it stops accepting connections, while our request is still open.
  await untilRefused(port);
  markDraining();

  const res = await answer;
  expect(res.status).toBe(200);
  // 19 °C / 78 % → dew point 15.077 °C (Magnus form, Alduchov & Eskridge 1996; worked in tests/server/psychrometrics.test.ts).
  expect(Math.abs(JSON.parse(res.body).dewPointC - 15.077)).toBeLessThan(0.05);
  expect(res.headers.connection).toBe("close");

  const { code, signal } = await exited;
  expect({ code, signal }, output).toEqual({ code: 0, signal: null });
  expect(output).toMatch(/"msg":"stopped"/);
});
