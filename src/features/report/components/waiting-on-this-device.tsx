import { useEffect, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { getQueueState, loadQueue, subscribeQueue } from "../lib/report-queue";
import { englishWaitingWords, type WaitingWords } from "../lib/waiting-words";

/**
 * For a page that could not reach the server (opened with no signal): says a report is kept here,
 * without showing it (whose it is is not known yet), and opens the page again once back online.
 * It sits in the router's error page, which staff load too, so it stays away from the language
 * machinery (the officers' queue's first load must not carry i18next): its words come as a prop,
 * English by default (see waiting-words.ts).
 */
export function WaitingOnThisDevice({ words = englishWaitingWords }: { words?: WaitingWords }) {
  const [count, setCount] = useState(() => getQueueState().items.length);
  useEffect(() => {
    const refresh = () => setCount(getQueueState().items.length);
    const unsubscribe = subscribeQueue(refresh);
    void loadQueue().then(refresh);
    const reload = () => window.location.reload();
    window.addEventListener("online", reload);
    return () => {
      unsubscribe();
      window.removeEventListener("online", reload);
    };
  }, []);
  if (!count) return null;
  return (
    <Alert tone="warning" title={words.title} live="none" className="mx-auto w-full max-w-reading">
      <p>{words.body}</p>
    </Alert>
  );
}
