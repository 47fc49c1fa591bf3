import { useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";

interface TextActionFormProps {
  label: string;
  hint?: string;
  submitLabel: string;
  busy: boolean;
  error: unknown;
  /** Staff get a note for staff only beside the text the tenant sees. */
  withNote?: boolean;
  onSubmit: (text: string, note: string | null, done: () => void) => void;
  /** Said when the box is empty (the tenant's page passes it in the tenant's language). */
  missingText?: string;
}

/** One piece of text (and, for staff, an optional staff-only note) sent with one press. */
export function TextActionForm({
  label,
  hint,
  submitLabel,
  busy,
  error,
  withNote,
  onSubmit,
  missingText = "Write this before sending.",
}: TextActionFormProps) {
  const [text, setText] = useState("");
  const [note, setNote] = useState("");
  const [missing, setMissing] = useState<string | undefined>();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!text.trim()) return setMissing(missingText);
    setMissing(undefined);
    onSubmit(text.trim(), note.trim() || null, () => {
      setText("");
      setNote("");
    });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
      <Textarea label={label} hint={hint} value={text} onChange={(e) => setText(e.target.value)} error={missing} rows={4} />
      {withNote ? (
        <Textarea
          label="Note for staff"
          hint="Staff only: never shown or sent to the tenant."
          optional
          value={note}
          onChange={(e) => setNote(e.target.value)}
          rows={2}
        />
      ) : null}
      {error ? (
        <Alert tone="danger" live="alert">
          {errorMessage(error)}
        </Alert>
      ) : null}
      <div>
        <Button type="submit" busy={busy}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}
