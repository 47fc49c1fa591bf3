// The local mail catcher (maildev) that npm start, start:cluster and dev run on loopback: SMTP on
// `port`, its inbox on `webPort`.
import { spawn, type ChildProcess, type StdioOptions } from "node:child_process";
import { projectRoot } from "./paths.js";

/** maildev's command line after `node`. */
export const mailCatcherArgs = (smtp: { port: number; webPort: number }): string[] => [
  "node_modules/maildev/bin/maildev",
  "--ip",
  "127.0.0.1",
  "--web-ip",
  "127.0.0.1",
  "-s",
  String(smtp.port),
  "-w",
  String(smtp.webPort),
  "--silent",
];

/** Starts maildev as a child of this process (its errors on our stderr). */
export const startMailCatcher = (
  smtp: { port: number; webPort: number },
  stdio: StdioOptions = ["ignore", "ignore", "inherit"],
): ChildProcess => spawn(process.execPath, mailCatcherArgs(smtp), { cwd: projectRoot, stdio });
