import { useId, useState, type FormEvent } from "react";
import { Button } from "@/components/ui/button";
import { FieldError, Input } from "@/components/ui/field";
import { errorMessage, isApiError } from "@/lib/api-client";
import { WEBHOOK_EVENT_TYPES, type WebhookEventType } from "@/lib/contracts";
import { webhookEndpointSchema } from "@/lib/schemas/webhooks";
import { useCreateWebhook } from "../api/create-webhook";
import { webhookEventLabels } from "./labels";
import { SecretNotice } from "./secret-notice";

/** Register an endpoint: its address, what it is, and the events it receives. */
export function WebhookForm() {
  const create = useCreateWebhook();
  const eventsId = useId();
  const [url, setUrl] = useState("");
  const [description, setDescription] = useState("");
  const [events, setEvents] = useState<WebhookEventType[]>([...WEBHOOK_EVENT_TYPES]);
  const [errors, setErrors] = useState<Record<string, string>>({});
  const [secret, setSecret] = useState<string | null>(null);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const parsed = webhookEndpointSchema.safeParse({ url, description, eventTypes: events });
    if (!parsed.success) {
      setErrors(Object.fromEntries(parsed.error.issues.map((i) => [String(i.path[0]), i.message])));
      return;
    }
    setErrors({});
    create.mutate(parsed.data, {
      onSuccess: (answer) => {
        setSecret(answer.secret);
        setUrl("");
        setDescription("");
      },
      onError: (error) => {
        if (isApiError(error) && error.fieldErrors.length) {
          setErrors(Object.fromEntries(error.fieldErrors.map((f) => [f.field, f.message])));
        }
      },
    });
  };

  return (
    <div className="flex flex-col gap-4">
      {secret ? <SecretNotice secret={secret} onDone={() => setSecret(null)} /> : null}
      <form onSubmit={submit} noValidate className="flex max-w-reading flex-col gap-4">
        <Input
          label="Address"
          hint="Where Dewline sends each event: an https:// address of your own system."
          value={url}
          onChange={(e) => setUrl(e.target.value)}
          error={errors.url}
          inputMode="url"
          autoComplete="off"
        />
        <Input
          label="What it is"
          optional
          hint="For example, the housing management system."
          value={description}
          onChange={(e) => setDescription(e.target.value)}
          error={errors.description}
        />
        <fieldset aria-describedby={errors.eventTypes ? `${eventsId}-error` : undefined}>
          <legend className="font-semibold text-ink">Events to send</legend>
          {errors.eventTypes ? <FieldError id={`${eventsId}-error`}>{errors.eventTypes}</FieldError> : null}
          <div className="mt-2 grid gap-2 sm:grid-cols-2">
            {WEBHOOK_EVENT_TYPES.map((type) => (
              <label key={type} className="flex items-center gap-2">
                <input
                  type="checkbox"
                  checked={events.includes(type)}
                  onChange={(e) => setEvents(e.target.checked ? [...events, type] : events.filter((t) => t !== type))}
                />
                {webhookEventLabels[type]}
              </label>
            ))}
          </div>
        </fieldset>
        {create.isError && !Object.keys(errors).length ? (
          <p role="alert" className="text-sm text-rust-700">
            {errorMessage(create.error)}
          </p>
        ) : null}
        <span>
          <Button type="submit" busy={create.isPending}>
            Add the endpoint
          </Button>
        </span>
      </form>
    </div>
  );
}
