import { useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { useSendMessage } from "../api/send-message";
import type { Choice } from "../lib/labels";
import { RadioGroup } from "@/components/ui/option-radio-group";

type Audience = "tenant" | "internal";

const AUDIENCES: readonly Choice<Audience>[] = [
  { value: "tenant", label: "Message to the tenant (shown on their case page and e-mailed)" },
  { value: "internal", label: "Internal note (staff only)" },
];

/** A message to the tenant or a note for staff: the choice is made each time, never assumed. */
export function MessageForm({ caseId }: { caseId: number }) {
  const send = useSendMessage(caseId);
  const [audience, setAudience] = useState<Audience | "">("");
  const [body, setBody] = useState("");
  const [errors, setErrors] = useState<{ audience?: string; body?: string }>({});
  const [done, setDone] = useState<string | null>(null);
  const firstRef = useRef<HTMLInputElement>(null);
  const bodyRef = useRef<HTMLTextAreaElement>(null);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setDone(null);
    const found: typeof errors = {};
    if (!audience) found.audience = "Choose whether this goes to the tenant or stays with staff.";
    if (!body.trim()) found.body = "Write the message.";
    setErrors(found);
    if (found.audience) return firstRef.current?.focus();
    if (found.body) return bodyRef.current?.focus();
    const internal = audience === "internal";
    send.mutate(
      { body: body.trim(), internal },
      {
        onSuccess: () => {
          setDone(
            internal
              ? "Internal note added. Only staff can see it."
              : "Message sent to the tenant. It is on their case page, and an e-mail is on its way.",
          );
          setBody("");
          setAudience("");
        },
      },
    );
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-3">
      <RadioGroup
        legend="Who is this for?"
        options={AUDIENCES}
        value={audience}
        onChange={(v) => {
          setAudience(v);
          setErrors((x) => ({ ...x, audience: undefined }));
          setDone(null);
        }}
        error={errors.audience}
        inputRef={firstRef}
      />
      <Textarea
        ref={bodyRef}
        label={audience === "internal" ? "Note" : "Message"}
        rows={4}
        maxLength={5000}
        value={body}
        error={errors.body}
        onChange={(e) => {
          setBody(e.target.value);
          setDone(null);
          send.reset();
          if (errors.body) setErrors((x) => ({ ...x, body: undefined }));
        }}
      />
      {send.isError ? (
        <Alert tone="danger" title="This was not sent">
          {errorMessage(send.error)}
        </Alert>
      ) : null}
      {done ? <Alert tone="success">{done}</Alert> : null}
      <div>
        <Button type="submit" busy={send.isPending}>
          {audience === "internal" ? "Add internal note" : audience === "tenant" ? "Send to the tenant" : "Send"}
        </Button>
      </div>
    </form>
  );
}
