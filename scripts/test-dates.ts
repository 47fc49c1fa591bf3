// `npm run test:dates`: runs the date-sensitive domain and server suites with the test clock set to
// awkward moments (TEST_NOW, see tests/support/test-clock.ts), one after another, and prints one
// line per date. Each run starts its own throwaway MariaDB (the server project's global setup).
// Extra arguments go to every vitest run (e.g. a file filter).
import { mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { bankHolidayDates, isWorkingDay, localDate } from "../src/lib/domain/working-days.js";
import { projectRoot } from "./lib/paths.js";
import { runForExitCode } from "./lib/processes.js";

interface Moment {
  at: string;
  why: string;
  /** Checked before running, so a wrong premise fails loudly instead of testing nothing. */
  premise: () => string | null;
}

const london = (iso: string, options: Intl.DateTimeFormatOptions) =>
  new Date(iso).toLocaleString("en-GB", { timeZone: "Europe/London", ...options });
const weekday = (iso: string) => london(iso, { weekday: "long" });
const zone = (iso: string) => london(iso, { timeZoneName: "short" }).split(" ").at(-1);
const expect = (ok: boolean, message: string) => (ok ? null : message);

const MOMENTS: Moment[] = [
  {
    at: "2026-12-10T10:00:00Z",
    why: "a Thursday (16 and 17 days ahead are the same Monday)",
    premise: () => expect(weekday("2026-12-10T10:00:00Z") === "Thursday", "10 Dec 2026 is not a Thursday"),
  },
  {
    at: "2027-05-28T15:00:00+01:00",
    why: "a Friday before the Spring bank holiday (Mon 31 May 2027)",
    // date-holidays (through working-days.ts) says 31 May 2027 is a bank holiday in England and Wales.
    premise: () =>
      expect(
        weekday("2027-05-28T14:00:00Z") === "Friday" &&
          bankHolidayDates(2027).includes("2027-05-31") &&
          !isWorkingDay("2027-05-31"),
        "31 May 2027 is not a bank holiday after a Friday",
      ),
  },
  {
    at: "2026-12-24T16:00:00Z",
    why: "Christmas Eve (bank holidays 25, 28 Dec)",
    premise: () =>
      expect(bankHolidayDates(2026).includes("2026-12-25") && !isWorkingDay("2026-12-28"), "no bank holidays after 24 Dec 2026"),
  },
  {
    at: "2027-10-30T22:30:00+01:00",
    why: "the Saturday night before the clocks go back (Sun 31 Oct 2027)",
    premise: () =>
      expect(
        weekday("2027-10-30T21:30:00Z") === "Saturday" &&
          zone("2027-10-30T21:30:00Z") === "BST" &&
          zone("2027-10-31T01:30:00Z") === "GMT" &&
          localDate(new Date("2027-10-31T01:30:00Z")) === "2027-10-31",
        "London does not leave BST on 31 Oct 2027",
      ),
  },
  {
    at: "2028-02-29T09:00:00Z",
    why: "29 February of a leap year",
    premise: () => expect(localDate(new Date("2028-02-29T09:00:00Z")) === "2028-02-29", "2028-02-29 is not a date"),
  },
];

/** The suites whose results depend on "now": deadlines, working days, bookings, the queue's figures, tokens, readings. */
const DATE_SENSITIVE = [
  "tests/domain/working-days.test.ts",
  "tests/domain/deadlines.test.ts",
  "tests/domain/triage-priority.test.ts",
  "tests/domain/verification.test.ts",
  "tests/server/works.test.ts",
  "tests/server/deadline-digest.test.ts",
  "tests/server/queue.test.ts",
  "tests/server/investigation.test.ts",
  "tests/server/case-status.test.ts",
  "tests/server/assessments.test.ts",
  "tests/server/cases.test.ts",
  "tests/server/readings.test.ts",
  "tests/server/reading-import.test.ts",
  "tests/server/invitations.test.ts",
  "tests/server/seed.test.ts",
  "tests/server/escalation.test.ts",
  "tests/server/status-follows-work.test.ts",
  "tests/server/tenancy-end.test.ts",
];

interface JsonReport {
  numTotalTests: number;
  numPassedTests: number;
  numFailedTests: number;
}

const wrong = MOMENTS.map((m) => m.premise()).filter((p): p is string => p !== null);
if (wrong.length) {
  console.error(`test:dates: ${wrong.join("; ")}`);
  process.exit(2);
}

const scratch = mkdtempSync(path.join(tmpdir(), "dewline-test-dates-"));
const lines: string[] = [];
let failed = 0;
try {
  for (const [i, m] of MOMENTS.entries()) {
    const report = path.join(scratch, `run-${i}.json`);
    console.log(`\n\x1b[36m› TEST_NOW=${m.at}\x1b[0m (${m.why})`);
    const started = performance.now();
    const code = await runForExitCode(
      process.execPath,
      [
        "node_modules/vitest/vitest.mjs",
        "run",
        "--project",
        "domain",
        "--project",
        "server",
        "--reporter=dot",
        "--reporter=json",
        `--outputFile.json=${report}`,
        ...DATE_SENSITIVE,
        ...process.argv.slice(2),
      ],
      { cwd: projectRoot, env: { ...process.env, NODE_ENV: "test", TEST_NOW: m.at } },
    );
    const seconds = Math.round((performance.now() - started) / 1000);
    let counts = "no report";
    try {
      const r = JSON.parse(readFileSync(report, "utf8")) as JsonReport;
      counts = `${r.numPassedTests}/${r.numTotalTests} passed, ${r.numFailedTests} failed`;
    } catch {
      // vitest failed before writing its report; the exit code says so.
    }
    if (code !== 0) failed += 1;
    lines.push(
      `${code === 0 ? "PASS" : "FAIL"}  TEST_NOW=${m.at.padEnd(25)} ${counts.padEnd(28)} ${String(seconds).padStart(4)} s  ${m.why}`,
    );
  }
} finally {
  rmSync(scratch, { recursive: true, force: true });
}
console.log(`\ntest:dates — ${DATE_SENSITIVE.length} files at ${MOMENTS.length} dates:`);
for (const line of lines) console.log(line);
process.exit(failed ? 1 : 0);
