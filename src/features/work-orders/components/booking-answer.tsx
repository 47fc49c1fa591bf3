import type { WorkOrder } from "../api/case-types";
import { formatDateTimeZoned } from "@/lib/dates";

type Answer = "awaiting" | "confirmed" | "change-requested";

const answerOf = (o: Pick<WorkOrder, "booking" | "slot">): Answer | null => {
  if (!o.slot) return null;
  const r = o.booking?.response ?? null;
  if (r === "confirmed") return "confirmed";
  if (r === "change-requested") return "change-requested";
  return "awaiting";
};

function AnswerIcon({ answer }: { answer: Answer }) {
  // Each answer has its own shape as well as its own colour.
  if (answer === "confirmed")
    return (
      <svg viewBox="0 0 20 20" className="size-5 shrink-0 text-moss-700" aria-hidden="true">
        <circle cx="10" cy="10" r="8" fill="none" stroke="currentColor" strokeWidth="2" />
        <path d="M6 10.5l2.5 2.5L14 7.5" fill="none" stroke="currentColor" strokeWidth="2" />
      </svg>
    );
  if (answer === "change-requested")
    return (
      <svg viewBox="0 0 20 20" className="size-5 shrink-0 text-ember-800" aria-hidden="true">
        <path d="M3 7h11l-3-3M17 13H6l3 3" fill="none" stroke="currentColor" strokeWidth="2" />
      </svg>
    );
  return (
    <svg viewBox="0 0 20 20" className="size-5 shrink-0 text-ink-soft" aria-hidden="true">
      <circle cx="10" cy="10" r="8" fill="none" stroke="currentColor" strokeWidth="2" strokeDasharray="3 2" />
      <path d="M10 5.5V10l3 2" fill="none" stroke="currentColor" strokeWidth="2" />
    </svg>
  );
}

/** The tenant's answer to the offered appointment, in words with an icon beside them. */
export function BookingAnswerView({ order }: { order: Pick<WorkOrder, "booking" | "slot"> }) {
  const answer = answerOf(order);
  if (!answer) return <span className="text-ink-soft">No appointment offered yet</span>;
  const at = order.booking?.respondedAt ? ` on ${formatDateTimeZoned(order.booking.respondedAt)}` : "";
  return (
    <span className="flex items-start gap-2">
      <AnswerIcon answer={answer} />
      <span>
        {answer === "confirmed"
          ? `Confirmed${at}`
          : answer === "change-requested"
            ? `Asked for another time${at}`
            : "Awaiting the tenant's answer"}
        {answer === "change-requested" && order.booking?.reason ? (
          <span className="block text-ink-soft">Their reason: “{order.booking.reason}”</span>
        ) : null}
      </span>
    </span>
  );
}
