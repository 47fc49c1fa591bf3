import { useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import type { WebhookEndpointDto } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { useDeleteWebhook } from "../api/delete-webhook";
import { useWebhooks } from "../api/get-webhooks";
import { useRotateWebhookSecret } from "../api/rotate-webhook-secret";
import { useSendTestWebhook } from "../api/send-test-webhook";
import { useUpdateWebhook } from "../api/update-webhook";
import { webhookEventLabels } from "./labels";
import { SecretNotice } from "./secret-notice";
import { WebhookDeliveries } from "./webhook-deliveries";

type Confirm = "remove" | "rotate" | null;

function EndpointItem({ endpoint }: { endpoint: WebhookEndpointDto }) {
  const [confirm, setConfirm] = useState<Confirm>(null);
  const [secret, setSecret] = useState<string | null>(null);
  const [open, setOpen] = useState(false);
  const update = useUpdateWebhook();
  const remove = useDeleteWebhook();
  const rotate = useRotateWebhookSecret();
  const test = useSendTestWebhook();
  const name = endpoint.description || endpoint.url;
  const failure = [update, test].find((m) => m.isError)?.error;

  return (
    <li className="flex flex-col gap-2 py-4">
      <span className="flex flex-wrap items-baseline gap-x-3">
        <strong className="break-all">{name}</strong>
        {endpoint.active ? null : <span className="text-sm font-semibold text-rust-700">Switched off</span>}
      </span>
      {endpoint.description ? <span className="font-mono text-sm break-all">{endpoint.url}</span> : null}
      <span className="text-sm text-ink-soft">{endpoint.eventTypes.map((t) => webhookEventLabels[t]).join(" · ")}</span>
      <span className="text-sm">
        {endpoint.pending} waiting, {endpoint.failed} given up
        {endpoint.secretRotatedAt ? ` · secret replaced ${formatDateTime(endpoint.secretRotatedAt)}` : ""}
      </span>
      {secret ? <SecretNotice secret={secret} onDone={() => setSecret(null)} /> : null}
      <span className="flex flex-wrap gap-2">
        <Button size="sm" variant="secondary" aria-expanded={open} onClick={() => setOpen(!open)}>
          {open ? "Hide deliveries" : "Show deliveries"}
        </Button>
        <Button
          size="sm"
          variant="secondary"
          busy={test.isPending}
          onClick={() => test.mutate(endpoint.id)}
          disabled={!endpoint.active}
        >
          Send a test event
        </Button>
        <Button
          size="sm"
          variant="secondary"
          busy={update.isPending}
          onClick={() => update.mutate({ id: endpoint.id, patch: { active: !endpoint.active } })}
        >
          {endpoint.active ? "Switch off" : "Switch on"}
        </Button>
        <Button size="sm" variant="secondary" onClick={() => setConfirm("rotate")}>
          New signing secret
        </Button>
        <Button size="sm" variant="danger" onClick={() => setConfirm("remove")}>
          Remove
        </Button>
      </span>
      {test.isSuccess ? (
        <p role="status" className="text-sm text-ink-soft">
          The test event is on its way; its delivery appears below.
        </p>
      ) : null}
      {failure ? (
        <p role="alert" className="text-sm text-rust-700">
          {errorMessage(failure)}
        </p>
      ) : null}
      {open ? <WebhookDeliveries endpointId={endpoint.id} /> : null}
      <ConfirmDialog
        open={confirm === "remove"}
        title={`Remove ${name}?`}
        confirmLabel="Remove the endpoint"
        tone="danger"
        busy={remove.isPending}
        error={remove.isError ? errorMessage(remove.error) : null}
        onConfirm={() => remove.mutate(endpoint.id, { onSuccess: () => setConfirm(null) })}
        onCancel={() => setConfirm(null)}
      >
        Events will no longer be sent there, and its delivery history goes with it. Deliveries still waiting are dropped.
      </ConfirmDialog>
      <ConfirmDialog
        open={confirm === "rotate"}
        title="Make a new signing secret?"
        confirmLabel="Make a new secret"
        busy={rotate.isPending}
        error={rotate.isError ? errorMessage(rotate.error) : null}
        onConfirm={() =>
          rotate.mutate(endpoint.id, {
            onSuccess: (answer) => {
              setSecret(answer.secret);
              setConfirm(null);
            },
          })
        }
        onCancel={() => setConfirm(null)}
      >
        The new secret is shown once. For the next 24 hours events carry a signature with the old secret as well, so the receiving
        system can switch over without missing any.
      </ConfirmDialog>
    </li>
  );
}

/** The landlord's endpoints, each with its actions and deliveries. */
export function WebhookList() {
  const webhooks = useWebhooks();
  if (webhooks.isPending) return <LoadingState>Loading the endpoints…</LoadingState>;
  if (webhooks.isError) {
    return (
      <p role="alert" className="text-rust-700">
        {errorMessage(webhooks.error)}
      </p>
    );
  }
  if (!webhooks.data.items.length) {
    return <EmptyState title="No endpoints yet">Add one below to have your own systems told about case events.</EmptyState>;
  }
  return (
    <ul className="flex flex-col divide-y divide-line">
      {webhooks.data.items.map((endpoint) => (
        <EndpointItem key={endpoint.id} endpoint={endpoint} />
      ))}
    </ul>
  );
}
