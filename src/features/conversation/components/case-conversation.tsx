import { useEffect, useRef, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { useConversation } from "../api/get-conversation";
import { useMarkRead } from "../api/mark-read";
import { ComposeBox } from "./compose-box";
import { MessageThread, type Viewer } from "./message-thread";
import { englishConversationWords, type ConversationWords } from "../lib/words";

export interface CaseConversationProps {
  caseId: number;
  /** The tenant reads their landlord's messages and writes to them; staff also write internal notes and see read receipts. */
  viewer: Viewer;
  /** What the tenant reads, in their language (English by default; staff pages always read English). */
  words?: ConversationWords;
}

const messagesWord = (n: number) => (n === 1 ? "1 new message" : `${n} new messages`);

/**
 * The conversation on a case between the tenant and the landlord's staff: the thread (oldest first),
 * what is new since the person last looked, and the box to write in. Opening it marks it read.
 */
export function CaseConversation({ caseId, viewer, words = englishConversationWords }: CaseConversationProps) {
  const thread = useConversation(caseId);
  const { mutate: markRead } = useMarkRead(caseId);
  // What was unread when the conversation was opened stays marked "New" for this visit.
  const [atOpen, setAtOpen] = useState<{ readUpTo: number; unread: number } | null>(null);
  if (thread.data && atOpen === null) setAtOpen({ readUpTo: thread.data.readUpTo ?? 0, unread: thread.data.unread });

  const newest = thread.data?.messages.at(-1)?.id;
  const unread = thread.data?.unread ?? 0;
  const markedUpTo = useRef<number | null>(null);
  useEffect(() => {
    // Read up to the newest message shown, once per newest message (a failure is not retried in a loop).
    if (unread > 0 && newest !== undefined && markedUpTo.current !== newest) {
      markedUpTo.current = newest;
      markRead(newest);
    }
  }, [unread, newest, markRead]);

  return (
    <div className="flex flex-col gap-4">
      {atOpen && atOpen.unread > 0 ? (
        <p role="status" className="font-semibold text-dew-800">
          {viewer === "tenant"
            ? words.unreadNote(atOpen.unread)
            : `${messagesWord(atOpen.unread)} from the tenant since you last looked.`}
        </p>
      ) : null}
      {thread.isPending ? (
        <LoadingState>{words.loading}</LoadingState>
      ) : thread.isError ? (
        <Alert tone="warning" title={words.loadFailed}>
          <p translate="no">{errorMessage(thread.error)}</p>
          <Button variant="secondary" size="sm" className="mt-2" onClick={() => void thread.refetch()}>
            {words.tryAgain}
          </Button>
        </Alert>
      ) : (
        <MessageThread messages={thread.data.messages} viewer={viewer} readUpToAtOpen={atOpen?.readUpTo ?? 0} words={words} />
      )}
      <ComposeBox caseId={caseId} viewer={viewer} words={words} />
    </div>
  );
}
