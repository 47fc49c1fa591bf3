import { cn } from "@/lib/cn";
import { statusLabelFor, tenantStage, type Audience, type TenantStageFacts } from "../labels";

/** The status in words, in a quiet outline: words carry the meaning, not colour. */
export function StatusBadge({
  status,
  className,
  audience = "tenant",
  facts,
  label,
  statusWord = "Status: ",
}: {
  status: string;
  className?: string;
  audience?: Audience;
  /** For the tenant: what else has happened (the written summary sent). */
  facts?: TenantStageFacts;
  /** The status in the reader's language, from a translated page (the English words otherwise). */
  label?: string;
  statusWord?: string;
}) {
  return (
    <span
      className={cn(
        "inline-flex w-fit items-center gap-1.5 rounded-pill border border-dew-700 bg-dew-50 px-3 py-0.5 text-sm font-semibold text-dew-800",
        className,
      )}
    >
      <span className="sr-only">{statusWord}</span>
      {label ?? (audience === "tenant" ? tenantStage(status, facts).label : statusLabelFor(audience)(status))}
    </span>
  );
}
