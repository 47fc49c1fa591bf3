// A real HTTP receiver for webhook tests, on 127.0.0.1: keeps every request's headers and raw body,
// and answers with the status codes the test queues (200 once the queue is empty).
import { createServer, type IncomingHttpHeaders } from "node:http";
import type { AddressInfo } from "node:net";

export interface ReceivedHook {
  path: string;
  headers: IncomingHttpHeaders;
  body: string;
}

export interface WebhookReceiver {
  url: string;
  received: ReceivedHook[];
  /** Status codes to answer with, in order. */
  answers: number[];
  close(): Promise<void>;
}

export async function startWebhookReceiver(): Promise<WebhookReceiver> {
  const received: ReceivedHook[] = [];
  const answers: number[] = [];
  const server = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on("data", (c: Buffer) => chunks.push(c));
    req.on("end", () => {
      received.push({ path: req.url ?? "", headers: req.headers, body: Buffer.concat(chunks).toString("utf8") });
      res.statusCode = answers.shift() ?? 200;
      res.end("thanks");
    });
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const { port } = server.address() as AddressInfo;
  return {
    url: `http://127.0.0.1:${port}/dewline-events`,
    received,
    answers,
    close: () => new Promise<void>((resolve) => server.close(() => resolve())),
  };
}
