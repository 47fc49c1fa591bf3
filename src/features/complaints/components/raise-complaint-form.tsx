import { useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { useRaiseComplaint } from "../api/raise-complaint";

/** A formal complaint about the case: by the tenant in their words, or by staff writing down what the tenant said. */
export function RaiseComplaintForm({ caseId, staff }: { caseId: number; staff: boolean }) {
  const raise = useRaiseComplaint(caseId);
  const [text, setText] = useState("");
  const [error, setError] = useState<string | undefined>();
  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (!text.trim()) return setError("Write the complaint.");
    setError(undefined);
    raise.mutate(text.trim(), { onSuccess: () => setText("") });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
      <Textarea
        label={staff ? "The tenant's complaint, in their words" : "What are you unhappy about?"}
        hint={
          staff
            ? "Raised for the tenant: they are sent the acknowledgement and every letter."
            : "Tell us in your own words. We will acknowledge your complaint and tell you when to expect our response."
        }
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
          Make a complaint
        </Button>
      </div>
    </form>
  );
}
