// The reports kept on this phone, for the pages that show them: read once, sent when the page opens,
// when the phone says it is back online, and when the tenant asks.
import { useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useRef, useState, useSyncExternalStore } from "react";
import { caseKeys } from "@/lib/query-keys";
import {
  flushQueue,
  getQueueState,
  loadQueue,
  removeQueued,
  sendQueued,
  subscribeQueue,
  type QueuedReport,
  type SendResult,
} from "../lib/report-queue";

export type SentResult = Extract<SendResult, { kind: "sent" }>;

/** `userId` null: whoever is signed in is not known (the page could not reach the server); nothing is sent. */
export function useReportQueue(userId: number | null, onSent?: (result: SentResult) => void) {
  const state = useSyncExternalStore(subscribeQueue, getQueueState, getQueueState);
  const queryClient = useQueryClient();
  const [sent, setSent] = useState<SentResult[]>([]);
  /** Reports whose last try, asked for by the tenant, found no signal. */
  const [stillWaiting, setStillWaiting] = useState<string[]>([]);
  const onSentRef = useRef(onSent);
  useEffect(() => {
    onSentRef.current = onSent;
  }, [onSent]);

  const handle = useCallback(
    (results: SendResult[]) => {
      const done = results.filter((r): r is SentResult => r.kind === "sent");
      if (!done.length) return;
      void queryClient.invalidateQueries({ queryKey: caseKeys.lists() });
      setSent((list) => [...list, ...done]);
      for (const r of done) onSentRef.current?.(r);
    },
    [queryClient],
  );

  useEffect(() => {
    if (userId === null) {
      void loadQueue();
      return;
    }
    const flush = () => void flushQueue(userId).then(handle, () => undefined);
    flush();
    window.addEventListener("online", flush);
    return () => window.removeEventListener("online", flush);
  }, [userId, handle]);

  const retry = async (id: string) => {
    setStillWaiting((list) => list.filter((x) => x !== id));
    const result = await sendQueued(id);
    if (result.kind === "waiting") setStillWaiting((list) => [...list, id]);
    handle([result]);
  };

  const items: QueuedReport[] = state.items.filter((r) => userId === null || r.userId === userId);
  return {
    loaded: state.loaded,
    items,
    isSending: (id: string) => state.sending.includes(id),
    stillWaiting: (id: string) => stillWaiting.includes(id),
    sent,
    retry,
    remove: removeQueued,
  };
}

/** Whether this person has reports kept on the phone (once the queue has been read). */
export function useKeptReports(userId: number) {
  const state = useSyncExternalStore(subscribeQueue, getQueueState, getQueueState);
  useEffect(() => void loadQueue(), []);
  return { loaded: state.loaded, count: state.items.filter((r) => r.userId === userId).length };
}
