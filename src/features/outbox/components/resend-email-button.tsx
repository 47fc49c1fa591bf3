import { Button } from "@/components/ui/button";
import { errorMessage } from "@/lib/api-client";
import type { OutboxStatusName } from "@/lib/contracts";
import { useResendEmail } from "../api/resend-email";

export interface ResendEmailButtonProps {
  outboxId: number;
  status: OutboxStatusName;
  /** Who it went to, for the button's accessible name. */
  to: string;
}

/** "Send again" beside an e-mail that was sent or failed; one still queued goes out by itself. */
export function ResendEmailButton({ outboxId, status, to }: ResendEmailButtonProps) {
  const resend = useResendEmail();
  if (status !== "sent" && status !== "failed") return null;
  if (resend.isSuccess) {
    return (
      <p role="status" className="text-sm text-ink-soft">
        It will be sent again in a moment.
      </p>
    );
  }
  return (
    <span className="flex flex-wrap items-center gap-2">
      <Button
        size="sm"
        variant="secondary"
        busy={resend.isPending}
        onClick={() => resend.mutate(outboxId)}
        aria-label={`Send the e-mail to ${to} again`}
      >
        Send again
      </Button>
      {resend.isError ? (
        <span role="alert" className="text-sm text-rust-700">
          {errorMessage(resend.error)}
        </span>
      ) : null}
    </span>
  );
}
