import { useState } from "react";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import type { WebhookDeliveryDto } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { DELIVERIES_PAGE_SIZE, useWebhookDeliveries } from "../api/get-webhook-deliveries";
import { useResendWebhookDelivery } from "../api/resend-webhook-delivery";
import { deliveryStatusLabels, webhookEventLabels } from "./labels";

function ResendButton({ endpointId, delivery }: { endpointId: number; delivery: WebhookDeliveryDto }) {
  const resend = useResendWebhookDelivery();
  if (delivery.status === "sending") return null;
  return (
    <span className="flex flex-wrap items-center gap-2">
      <Button
        size="sm"
        variant="secondary"
        busy={resend.isPending}
        onClick={() => resend.mutate({ endpointId, deliveryId: delivery.id })}
        aria-label={`Send again: ${webhookEventLabels[delivery.eventType]}, ${formatDateTime(delivery.occurredAt)}`}
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

/** Each delivery to one endpoint, newest first, with every attempt's answer. */
export function WebhookDeliveries({ endpointId }: { endpointId: number }) {
  const [page, setPage] = useState(1);
  const deliveries = useWebhookDeliveries(endpointId, page);
  if (deliveries.isPending) return <LoadingState>Loading the deliveries…</LoadingState>;
  if (deliveries.isError) {
    return (
      <p role="alert" className="text-rust-700">
        {errorMessage(deliveries.error)}
      </p>
    );
  }
  const { items, total } = deliveries.data;
  if (!items.length) return <EmptyState title="Nothing sent yet">Events appear here as they happen.</EmptyState>;
  const pages = Math.max(1, Math.ceil(total / DELIVERIES_PAGE_SIZE));
  return (
    <div className="flex flex-col gap-3">
      <ul className="flex flex-col divide-y divide-line">
        {items.map((d) => (
          <li key={d.id} className="flex flex-col gap-1 py-2">
            <span className="flex flex-wrap items-baseline gap-x-3">
              <strong>{webhookEventLabels[d.eventType]}</strong>
              {d.case?.reference ? <span>{d.case.reference}</span> : null}
              <span className="text-sm text-ink-soft">{formatDateTime(d.occurredAt)}</span>
              <span className="text-sm font-semibold">{deliveryStatusLabels[d.status]}</span>
            </span>
            <span className="font-mono text-xs break-all text-ink-soft">Event id {d.eventId}</span>
            {d.status === "pending" && d.nextAttemptAt ? (
              <span className="text-sm text-ink-soft">Next try {formatDateTime(d.nextAttemptAt)}</span>
            ) : null}
            {d.history.length ? (
              <ol className="text-sm" aria-label="Attempts, newest first">
                {d.history.map((a, i) => (
                  <li key={i}>
                    {formatDateTime(a.at)}: {a.statusCode === null ? "no answer" : `answered ${a.statusCode}`}
                    {a.error && a.statusCode === null ? ` (${a.error})` : ""}, {a.durationMs} ms
                  </li>
                ))}
              </ol>
            ) : null}
            <ResendButton endpointId={endpointId} delivery={d} />
          </li>
        ))}
      </ul>
      {pages > 1 ? (
        <nav aria-label="Delivery pages" className="flex items-center gap-2">
          <Button size="sm" variant="secondary" disabled={page <= 1} onClick={() => setPage(page - 1)}>
            Newer
          </Button>
          <span className="text-sm">
            Page {page} of {pages}
          </span>
          <Button size="sm" variant="secondary" disabled={page >= pages} onClick={() => setPage(page + 1)}>
            Older
          </Button>
        </nav>
      ) : null}
    </div>
  );
}
