import { useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { useRaiseComplaint } from "../api/raise-complaint";
import { englishComplaintWords, type ComplaintWords } from "../lib/words";

/** A formal complaint about the case: by the tenant in their words, or by staff writing down what the tenant said. */
export function RaiseComplaintForm({
  caseId,
  staff,
  words = englishComplaintWords,
}: {
  caseId: number;
  staff: boolean;
  /** The tenant's page passes them in the tenant's language (staff pages load no i18next). */
  words?: ComplaintWords;
}) {
  const raise = useRaiseComplaint(caseId);
  const [text, setText] = useState("");
  const [error, setError] = useState<string | undefined>();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!text.trim()) return setError(words.raiseEmpty);
    setError(undefined);
    raise.mutate(text.trim(), { onSuccess: () => setText("") });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
      <Textarea
        label={staff ? "The tenant's complaint, in their words" : words.raiseLabel}
        hint={staff ? "Raised for the tenant: they are sent the acknowledgement and every letter." : words.raiseHint}
        value={text}
        onChange={(e) => setText(e.target.value)}
        error={error}
        rows={4}
        maxLength={5000}
      />
      {raise.isError ? (
        <Alert tone="danger" live="alert">
          {errorMessage(raise.error)}
        </Alert>
      ) : null}
      <div>
        <Button type="submit" busy={raise.isPending}>
          {words.raiseSubmit}
        </Button>
      </div>
    </form>
  );
}
