import { useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Textarea } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { ApiError, errorMessage } from "@/lib/api-client";
import type { ComplaintPolicyResponse } from "@/lib/contracts";
import { useComplaintPolicy } from "../api/get-complaint-policy";
import { useResetComplaintPolicy } from "../api/reset-complaint-policy";
import { useUpdateComplaintPolicy, type ComplaintLetterKind, type ComplaintPolicyUpdate } from "../api/update-complaint-policy";

const TIMEFRAMES = [
  { name: "stage1AcknowledgeWorkingDays", label: "Stage 1: acknowledge within", fallback: 5 },
  { name: "stage1RespondWorkingDays", label: "Stage 1: respond within (of the acknowledgement)", fallback: 10 },
  { name: "stage2AcknowledgeWorkingDays", label: "Stage 2: acknowledge within", fallback: 5 },
  { name: "stage2RespondWorkingDays", label: "Stage 2: respond within (of the acknowledgement)", fallback: 20 },
  { name: "extensionMaxWorkingDays", label: "One extension per stage of at most", fallback: 10 },
] as const;
type TimeframeName = (typeof TIMEFRAMES)[number]["name"];

const LETTER_TITLES: Record<ComplaintLetterKind, string> = {
  acknowledgement: "Acknowledgement",
  extension: "Extension",
  "stage-response": "Stage 1 response",
  "final-response": "Final response (must keep {{escalationRoute}})",
};

/** The complaint timeframes, the escalation route and the four letters: in force, changed, or back to the default. */
export function ComplaintPolicyForm() {
  const policy = useComplaintPolicy();
  if (policy.isPending) return <LoadingState>Loading your complaint policy…</LoadingState>;
  if (policy.isError) return <Alert tone="danger">{errorMessage(policy.error)}</Alert>;
  const key = JSON.stringify(policy.data);
  return <Editor key={key} policy={policy.data} />;
}

function Editor({ policy }: { policy: ComplaintPolicyResponse }) {
  const update = useUpdateComplaintPolicy();
  const reset = useResetComplaintPolicy();
  const [days, setDays] = useState<Record<TimeframeName, string>>(
    () => Object.fromEntries(TIMEFRAMES.map((f) => [f.name, String(policy[f.name])])) as Record<TimeframeName, string>,
  );
  const [route, setRoute] = useState(policy.escalationRoute);
  const [letters, setLetters] = useState(() =>
    Object.fromEntries(policy.letters.map((l) => [l.kind, { subject: l.subject, body: l.body }])),
  );
  const fieldError = (field: string) =>
    update.error instanceof ApiError ? update.error.fieldErrors.find((f) => f.field === field)?.message : undefined;

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const body: ComplaintPolicyUpdate = {
      ...(Object.fromEntries(TIMEFRAMES.map((f) => [f.name, Number(days[f.name])])) as Record<TimeframeName, number>),
      escalationRoute: route.trim() || null,
      // Only letters changed from what is in force are sent, so an untouched default stays ours.
      letters: Object.fromEntries(
        policy.letters
          .filter((l) => letters[l.kind]!.subject !== l.subject || letters[l.kind]!.body !== l.body)
          .map((l) => [l.kind, letters[l.kind]]),
      ),
    };
    update.mutate(body);
  };

  return (
    <form onSubmit={submit} className="flex flex-col gap-4" noValidate>
      <p className="text-sm text-ink-soft">
        {policy.source === "landlord"
          ? "Your organisation's own complaint timeframes are in force."
          : "The default is in force: the complaint-handling timeframes in our trade notes (from memory; check the current Complaint Handling Code before relying on them)."}{" "}
        Working days leave out weekends and bank holidays in England and Wales.
      </p>
      <div className="grid gap-3 sm:grid-cols-2">
        {TIMEFRAMES.map((f) => (
          <Input
            key={f.name}
            label={`${f.label} (working days)`}
            hint={`Default ${f.fallback}.`}
            inputMode="numeric"
            value={days[f.name]}
            onChange={(e) => setDays((d) => ({ ...d, [f.name]: e.target.value }))}
            error={fieldError(f.name)}
          />
        ))}
      </div>
      <Textarea
        label="How to take a complaint further (told in the final response)"
        value={route}
        onChange={(e) => setRoute(e.target.value)}
        rows={3}
        error={fieldError("escalationRoute")}
      />
      <details>
        <summary className="cursor-pointer font-semibold">Letters and their placeholders</summary>
        <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-3 text-sm">
          {policy.placeholders.map((p) => (
            <div key={p.name} className="contents">
              <dt>
                <code>{`{{${p.name}}}`}</code>
              </dt>
              <dd>{p.meaning}</dd>
            </div>
          ))}
        </dl>
        {policy.letters.map((l) => (
          <fieldset key={l.kind} className="mt-3 flex flex-col gap-2 border-t border-line pt-3">
            <legend className="font-semibold">
              {LETTER_TITLES[l.kind]} {l.source === "default" ? "(our wording)" : "(your wording)"}
            </legend>
            <Input
              label="Subject"
              value={letters[l.kind]!.subject}
              onChange={(e) => setLetters((all) => ({ ...all, [l.kind]: { ...all[l.kind]!, subject: e.target.value } }))}
              error={fieldError(`letters.${l.kind}.subject`)}
            />
            <Textarea
              label="Letter"
              rows={6}
              value={letters[l.kind]!.body}
              onChange={(e) => setLetters((all) => ({ ...all, [l.kind]: { ...all[l.kind]!, body: e.target.value } }))}
              error={fieldError(`letters.${l.kind}.body`)}
            />
          </fieldset>
        ))}
      </details>
      {update.isError ? (
        <Alert tone="danger" live="alert">
          {errorMessage(update.error)}
        </Alert>
      ) : null}
      {update.isSuccess ? (
        <Alert tone="success" live="status">
          Complaint policy saved.
        </Alert>
      ) : null}
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={update.isPending}>
          Save the complaint policy
        </Button>
        {policy.source === "landlord" || policy.letters.some((l) => l.source === "landlord") ? (
          <Button variant="secondary" busy={reset.isPending} onClick={() => reset.mutate()}>
            Go back to the default
          </Button>
        ) : null}
      </div>
    </form>
  );
}
