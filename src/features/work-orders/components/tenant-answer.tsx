import { cn } from "@/lib/cn";
import type { WorkOrder } from "../api/types";
import { answerLabels, type TenantAnswer } from "../lib/labels";

/** The tenant's answer to the current booking; null when the order has no booking to answer. */
export function tenantAnswerOf(order: Pick<WorkOrder, "status" | "slot" | "booking">): TenantAnswer | "done" | null {
  if (order.status === "done") return "done";
  if (!order.slot || order.status === "cancelled" || order.status === "unscheduled") return null;
  if (order.status === "change-requested" || order.booking?.response === "change-requested") return "change-requested";
  if (order.status === "confirmed" || order.booking?.response === "confirmed") return "confirmed";
  return "awaiting";
}

const styles: Record<TenantAnswer | "done", string> = {
  awaiting: "text-ink-soft",
  confirmed: "text-moss-700",
  "change-requested": "text-ember-800",
  done: "text-ink",
};

function AnswerIcon({ answer }: { answer: TenantAnswer | "done" }) {
  const common = { viewBox: "0 0 16 16", className: "mt-0.5 size-4 shrink-0", "aria-hidden": true } as const;
  switch (answer) {
    case "confirmed":
    case "done":
      return (
        <svg {...common}>
          <circle cx="8" cy="8" r="7" fill="currentColor" />
          <path
            d="m4.5 8.2 2.3 2.3 4.7-4.8"
            fill="none"
            stroke="#fff"
            strokeWidth="1.8"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </svg>
      );
    case "change-requested":
      return (
        <svg {...common}>
          <path d="M8 1.2 15 14H1z" fill="currentColor" />
          <path d="M8 5.5v4M8 11.6v.1" stroke="#fff" strokeWidth="1.7" strokeLinecap="round" />
        </svg>
      );
    default:
      return (
        <svg {...common}>
          <circle cx="8" cy="8" r="6.2" fill="none" stroke="currentColor" strokeWidth="1.6" />
          <path d="M8 4.5V8l2.4 1.6" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" />
        </svg>
      );
  }
}

/** The tenant's answer in words with an icon of its own, so it never rests on colour alone. */
export function TenantAnswerText({
  order,
  className,
  withPrefix = false,
}: {
  order: Pick<WorkOrder, "status" | "slot" | "booking">;
  className?: string;
  withPrefix?: boolean;
}) {
  const answer = tenantAnswerOf(order);
  if (!answer) return null;
  const text = answer === "done" ? "Work done" : answerLabels[answer];
  return (
    <span className={cn("inline-flex items-start gap-1 text-sm font-semibold", styles[answer], className)}>
      <AnswerIcon answer={answer} />
      <span>
        {withPrefix && answer !== "done" ? <span className="sr-only">Tenant: </span> : null}
        {text}
      </span>
    </span>
  );
}
