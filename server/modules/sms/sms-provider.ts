// The hosted text-message service, through its official SDK (`notifications-node-client`): one
// generic template whose body is ((body)), so the words are ours (sms-texts.ts). SMS_BASE_URL points
// the SDK at the local stand-in in development and tests (scripts/lib/sms-stand-in.ts).
import { NotifyClient } from "notifications-node-client";

export interface SmsProviderConfig {
  baseUrl: string;
  apiKey: string;
  templateId: string;
  timeoutMs: number;
}

/** What one attempt came to: accepted with the provider's id, or refused (for good, or worth a retry). */
export type SmsSendResult = { ok: true; providerId: string } | { ok: false; retry: boolean; error: string };

export interface SmsProvider {
  send(to: string, body: string, reference: string): Promise<SmsSendResult>;
}

interface SdkError {
  response?: { status?: number; data?: { errors?: { message?: string }[] } };
  message?: string;
}

export function createSmsProvider(config: SmsProviderConfig): SmsProvider {
  const client = new NotifyClient(config.baseUrl, config.apiKey);
  return {
    async send(to, body, reference) {
      try {
        const response = await withTimeout(
          client.sendSms(config.templateId, to, { personalisation: { body }, reference }),
          config.timeoutMs,
        );
        const id = (response.data as { id?: unknown }).id;
        return typeof id === "string" ? { ok: true, providerId: id } : { ok: false, retry: true, error: "No id in the answer." };
      } catch (e) {
        const err = e as SdkError;
        const status = err.response?.status;
        const message = err.response?.data?.errors?.[0]?.message ?? err.message ?? String(e);
        // 400 (a bad number or template) and 403 (a bad key) will not mend on their own; 429, 5xx and
        // network failures may.
        const retry = status === undefined || status === 429 || status >= 500;
        return { ok: false, retry, error: `${status ?? "no answer"}: ${message}`.slice(0, 2000) };
      }
    },
  };
}

/** A silent provider never holds the relay (and its lease) for long. */
function withTimeout<T>(p: Promise<T>, ms: number): Promise<T> {
  let timer: NodeJS.Timeout | undefined;
  return Promise.race([
    p,
    new Promise<never>((_, reject) => {
      timer = setTimeout(() => reject(new Error(`no answer within ${ms} ms`)), ms);
      timer.unref();
    }),
  ]).finally(() => clearTimeout(timer));
}
