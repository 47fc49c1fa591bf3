// `npm run digest`: sends today's deadline digests to officers now, without waiting for 07:00 (for
// demos; the running server sends them by itself each working morning). Each officer still gets at
// most one a day, so running it again sends nothing new. `npm run digest -- --at 2026-12-07T08:00:00Z`
// runs it as if it were that moment (the digest of that London day).
import { parseArgs } from "node:util";
import { createAppContext } from "../server/app-context.js";
import { loadConfig } from "../server/config/env.js";
import { sendDigestsNow } from "../server/modules/digest/digest.scheduler.js";

const { values } = parseArgs({ options: { at: { type: "string" } } });
const now = values.at ? new Date(values.at) : new Date();
if (Number.isNaN(now.getTime())) {
  console.error(`--at must be a date and time such as 2026-12-07T08:00:00Z, got "${values.at}".`);
  process.exit(2);
}

const config = loadConfig();
const ctx = await createAppContext(config, { migrate: true });
try {
  const run = await sendDigestsNow(ctx.services, now);
  if (!run.workingDay) {
    console.log(`${run.date} is a weekend day or a bank holiday in England and Wales: no digests are sent on it.`);
  } else {
    console.log(
      `Deadline digests for ${run.date}: ${run.sent} sent, ${run.alreadySent} already sent earlier that day` +
        (run.failed ? `, ${run.failed} could not be sent (see the log above)` : "") +
        `. Officers with nothing due get none.`,
    );
    if (config.env !== "production") console.log(`Mail inbox: http://127.0.0.1:${config.smtp.webPort}`);
  }
  process.exitCode = run.failed ? 1 : 0;
} finally {
  await ctx.close();
}
