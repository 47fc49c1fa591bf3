import { cn } from "@/lib/cn";
import { userStatusLabels, type UserStatus } from "../api/types";

const statusClasses: Record<UserStatus, string> = {
  active: "bg-moss-50 text-moss-700 border-moss-600",
  invited: "bg-dew-50 text-dew-800 border-dew-500",
  disabled: "bg-paper text-ink-soft border-line-strong border-dashed",
  cancelled: "bg-paper text-ink-soft border-line-strong border-dotted",
};

export function StatusBadge({ status }: { status: UserStatus }) {
  return (
    <span
      className={cn(
        "inline-flex items-center rounded-pill border px-2 py-0.5 text-xs font-semibold whitespace-nowrap",
        statusClasses[status],
      )}
    >
      {userStatusLabels[status]}
    </span>
  );
}
