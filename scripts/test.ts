// `npm test`: installs what the tests need (Debian's MariaDB, Chromium and mosquitto), type-checks, builds the
// server (and loads it under plain node) and the client for the browser tests, then runs every vitest
// project. Each database-backed project starts its own throwaway MariaDB and removes it at the end.
// Extra arguments go to vitest.
import { rmSync } from "node:fs";
import path from "node:path";
import { projectRoot } from "./lib/paths.js";
import { runForExitCode, runStep } from "./lib/processes.js";
import { CHROMIUM, ensureSystemPackages, MARIADB, MOSQUITTO, POPPLER } from "./lib/system-packages.js";

const step = (line: string) => console.log(`\x1b[36m›\x1b[0m ${line}`);

await ensureSystemPackages([MARIADB, CHROMIUM, POPPLER, MOSQUITTO], step);
step("Type-checking (tsc -b)…");
await runStep(process.execPath, ["node_modules/typescript/bin/tsc", "-b"], { cwd: projectRoot });
step("Linting (ESLint, Prettier, server module circles)…");
await runStep("npm", ["run", "--silent", "lint"], { cwd: projectRoot });
step("Building the server (dist-server) and checking that its modules load under plain node…");
rmSync(path.join(projectRoot, "dist-server"), { recursive: true, force: true });
await runStep(process.execPath, ["node_modules/typescript/bin/tsc", "-p", "server/tsconfig.build.json"], { cwd: projectRoot });
// Production runs this output without tsx: loading every module (no connection, no listening) catches
// what only the compiled code can get wrong, such as entity classes read before they are defined.
await runStep(
  process.execPath,
  [
    "--input-type=module",
    "-e",
    "await import('./dist-server/server/app.js'); await import('./dist-server/server/app-context.js');",
  ],
  { cwd: projectRoot },
);
step("Building the client for the browser tests…");
await runStep(process.execPath, ["node_modules/vite/bin/vite.js", "build", "--logLevel", "warn"], { cwd: projectRoot });
step("Running the tests…");
const code = await runForExitCode(process.execPath, ["node_modules/vitest/vitest.mjs", "run", ...process.argv.slice(2)], {
  cwd: projectRoot,
  env: { ...process.env, NODE_ENV: "test" },
});
process.exit(code);
