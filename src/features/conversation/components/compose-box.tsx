import { useId, useRef, useState, type FormEvent, type KeyboardEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { RadioGroup, type RadioChoice } from "@/components/ui/option-radio-group";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { MESSAGE_MAX_LENGTH, MESSAGE_MAX_PHOTOS, staffMessageSchema, tenantMessageSchema } from "@/lib/schemas/messages";
import { useSendMessage } from "../api/send-message";
import { ATTACHMENT_ACCEPT, addAttachments, sizeInWords } from "../lib/attachments";
import { englishConversationWords, type AttachmentProblem, type ConversationWords } from "../lib/words";
import type { Viewer } from "./message-thread";

type Audience = "tenant" | "internal";

const AUDIENCES: readonly RadioChoice<Audience>[] = [
  { value: "tenant", label: "The tenant", hint: "Shown on their case page and e-mailed to them." },
  { value: "internal", label: "Staff only (an internal note)", hint: "Never shown or sent to the tenant." },
];

interface Errors {
  audience?: string;
  body?: string;
}

/** Writes on the case: a tenant to the landlord (with photos), staff to the tenant or as an internal note. */
export function ComposeBox({
  caseId,
  viewer,
  words = englishConversationWords,
}: {
  caseId: number;
  viewer: Viewer;
  /** What the tenant reads (see ../lib/words.ts); staff always read English. */
  words?: ConversationWords;
}) {
  const send = useSendMessage(caseId);
  const formRef = useRef<HTMLFormElement>(null);
  const audienceRef = useRef<HTMLInputElement>(null);
  const bodyRef = useRef<HTMLTextAreaElement>(null);
  const fileId = useId();
  const [audience, setAudience] = useState<Audience | "">("");
  const [body, setBody] = useState("");
  const [photos, setPhotos] = useState<File[]>([]);
  const [refused, setRefused] = useState<{ name: string; problem: AttachmentProblem }[]>([]);
  const [errors, setErrors] = useState<Errors>({});
  const [done, setDone] = useState<string | null>(null);
  const staff = viewer === "staff";

  const changed = () => {
    setDone(null);
    if (send.isError) send.reset();
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setDone(null);
    // The server's own request schema, so the words match what it would answer.
    const found: Errors = {};
    if (staff && !audience) found.audience = "Choose whether this goes to the tenant or stays with staff.";
    const parsed = staff ? staffMessageSchema.shape.body.safeParse(body) : tenantMessageSchema.shape.body.safeParse(body);
    if (!parsed.success)
      found.body = staff
        ? (parsed.error.issues[0]?.message ?? "Write the message.")
        : body.trim()
          ? words.tooLong
          : words.writeTheMessage;
    setErrors(found);
    if (found.audience) return audienceRef.current?.focus();
    if (found.body || !parsed.success) return bodyRef.current?.focus();
    const internal = audience === "internal";
    send.mutate(staff ? { viewer: "staff", body: parsed.data, internal } : { viewer: "tenant", body: parsed.data, photos }, {
      onSuccess: ({ photoCount }) => {
        setDone(
          staff
            ? internal
              ? "Internal note added. Only staff can see it."
              : "Message sent to the tenant. It is on their case page, and an e-mail is on its way to them."
            : words.sent(photoCount),
        );
        setBody("");
        setAudience("");
        setPhotos([]);
        setRefused([]);
      },
    });
  };

  // Ctrl+Enter (or ⌘+Enter) sends, as in most message boxes; Enter alone makes a new line.
  const onKeyDown = (e: KeyboardEvent<HTMLTextAreaElement>) => {
    if (e.key === "Enter" && (e.ctrlKey || e.metaKey)) {
      e.preventDefault();
      formRef.current?.requestSubmit();
    }
  };

  const buttonLabel = !staff
    ? words.send
    : audience === "internal"
      ? "Add internal note"
      : audience === "tenant"
        ? "Send to the tenant"
        : "Send";

  return (
    <form ref={formRef} onSubmit={submit} noValidate className="flex flex-col gap-3 border-t border-line pt-4">
      {staff ? (
        <RadioGroup
          legend="Who is this for?"
          options={AUDIENCES}
          value={audience}
          columns={2}
          onChange={(v) => {
            setAudience(v);
            setErrors((x) => ({ ...x, audience: undefined }));
            changed();
          }}
          error={errors.audience}
          inputRef={audienceRef}
        />
      ) : null}
      <Textarea
        ref={bodyRef}
        label={staff ? (audience === "internal" ? "Note" : "Message") : words.label}
        hint={staff ? undefined : words.hint}
        rows={4}
        maxLength={MESSAGE_MAX_LENGTH}
        value={body}
        error={errors.body}
        onKeyDown={onKeyDown}
        onChange={(e) => {
          setBody(e.target.value);
          changed();
          if (errors.body) setErrors((x) => ({ ...x, body: undefined }));
        }}
      />
      {staff ? null : (
        <div className="flex flex-col gap-2">
          <label htmlFor={fileId} className="font-semibold text-ink">
            {words.photos} <span className="font-normal text-ink-soft">{words.optional}</span>
          </label>
          <p id={`${fileId}-hint`} className="text-sm text-ink-soft">
            {words.photosHint(MESSAGE_MAX_PHOTOS)}
          </p>
          <input
            id={fileId}
            type="file"
            multiple
            accept={ATTACHMENT_ACCEPT}
            disabled={send.isPending || photos.length >= MESSAGE_MAX_PHOTOS}
            aria-describedby={`${fileId}-hint${refused.length ? ` ${fileId}-refused` : ""}`}
            onChange={(e) => {
              const picked = Array.from(e.target.files ?? []);
              e.target.value = "";
              if (!picked.length) return;
              const next = addAttachments(photos, picked);
              setPhotos(next.accepted);
              setRefused(next.refused);
              changed();
            }}
            className={cn(
              "block w-full text-base text-ink file:mr-3 file:min-h-10 file:cursor-pointer file:rounded-md file:border",
              "file:border-line-strong file:bg-surface file:px-4 file:font-semibold file:text-dew-800 hover:file:bg-dew-50",
            )}
          />
          {refused.length ? (
            <div id={`${fileId}-refused`}>
              <Alert tone="warning" live="alert" title={words.refusedTitle(refused.length)}>
                <ul className="list-disc space-y-1 pl-5">
                  {refused.map((r, i) => (
                    <li key={`${r.name}-${i}`}>
                      <span className="font-semibold break-all" translate="no">
                        {r.name}
                      </span>
                      : {words.problem(r.problem)}
                    </li>
                  ))}
                </ul>
              </Alert>
            </div>
          ) : null}
          {photos.length ? (
            <ul aria-label={words.chosenLabel} className="flex flex-col gap-1">
              {photos.map((file, i) => (
                <li key={`${file.name}-${file.size}-${file.lastModified}`} className="flex flex-wrap items-center gap-2 text-sm">
                  <span className="min-w-0 break-all" translate="no">
                    {file.name}
                  </span>
                  <span className="text-ink-soft" translate="no">
                    {sizeInWords(file.size)}
                  </span>
                  <Button
                    type="button"
                    variant="ghost"
                    size="sm"
                    disabled={send.isPending}
                    onClick={() => setPhotos((list) => list.filter((_, j) => j !== i))}
                  >
                    {words.remove}
                    <span className="sr-only" translate="no">
                      {" "}
                      {file.name}
                    </span>
                  </Button>
                </li>
              ))}
            </ul>
          ) : null}
        </div>
      )}
      {send.isError ? (
        <Alert tone="danger" title={staff ? "This was not sent" : words.notSent}>
          <span translate="no">{errorMessage(send.error)}</span>
        </Alert>
      ) : null}
      {done ? <Alert tone="success">{done}</Alert> : null}
      <div className="flex flex-wrap items-center gap-3">
        <Button type="submit" busy={send.isPending}>
          {buttonLabel}
        </Button>
        <span className="text-sm text-ink-soft">{staff ? "Ctrl + Enter also sends." : words.ctrlEnter}</span>
      </div>
    </form>
  );
}
