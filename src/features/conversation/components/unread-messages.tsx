import { Link } from "react-router-dom";
import { useUnreadMessages } from "../api/get-unread";
import { englishUnreadWords, type UnreadWords } from "../lib/words";
import type { Viewer } from "./message-thread";

const count = (n: number) => (n === 1 ? "1 new message" : `${n} new messages`);

/**
 * The signed-in person's cases with messages from the other side they have not read, each a link to
 * the conversation. Shows nothing while loading, on failure, or when everything has been read.
 * For staff: the cases assigned to them and those nobody is assigned to. A tenant's page passes `words`
 * in the tenant's language (staff pages load no i18next, so the English is the default).
 */
export function UnreadMessages({ viewer, words = englishUnreadWords }: { viewer: Viewer; words?: UnreadWords }) {
  const unread = useUnreadMessages();
  const items = unread.data?.items ?? [];
  if (items.length === 0) return null;
  const tenant = viewer === "tenant";
  return (
    <section aria-labelledby="unread-messages-heading" className="mb-5 rounded-md border-l-4 border-dew-600 bg-dew-50 px-4 py-3">
      <h2 id="unread-messages-heading" className="font-bold text-dew-800">
        {tenant ? words.heading : "Tenants have written"}
        <span className="font-normal"> ({tenant ? words.total(unread.data!.total) : count(unread.data!.total)})</span>
      </h2>
      <ul className="mt-1 flex flex-col gap-1">
        {items.map((i) => (
          <li key={i.caseId}>
            <Link to={`/cases/${i.caseId}#case-messages`} className="font-semibold text-dew-700 underline underline-offset-2">
              {tenant ? (
                <>
                  {words.report} <span translate="no">{i.reference ?? i.caseId}</span>
                </>
              ) : (
                (i.reference ?? `Case ${i.caseId}`)
              )}
            </Link>
            : {tenant ? words.line(i.unread) : `${count(i.unread)} from the tenant`}
          </li>
        ))}
      </ul>
    </section>
  );
}
