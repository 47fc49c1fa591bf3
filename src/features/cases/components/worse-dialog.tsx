import { useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import type { WorseResponse } from "@/lib/contracts";
import { useReportWorse } from "../api/report-worse";
import { Modal } from "./modal";

interface WorseButtonProps {
  caseId: number;
  onReported?: () => void;
}

/**
 * What the tenant is told afterwards: only what happened. "Told" only when someone was e-mailed;
 * "reopened" only when a finished or monitored report was reopened.
 */
function outcomeWords(outcome: WorseResponse): { title: string; body: string } {
  const reopened = outcome.reopened ? " Your report has been reopened, so your landlord will look at it again." : "";
  if (outcome.told === "nobody") {
    return {
      title: "Thank you, this is now part of your report",
      body: `What you wrote is on your report for your landlord's team to see.${reopened}`,
    };
  }
  return {
    title: "Thank you, your landlord has been told",
    body: `We have e-mailed ${outcome.told === "assignee" ? "the person looking after your report" : "your landlord's housing team"} with what you wrote.${reopened}`,
  };
}

/** "It's got worse": a short note to the landlord, added to the timeline. */
export function WorseButton({ caseId, onReported }: WorseButtonProps) {
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | undefined>();
  const [done, setDone] = useState<WorseResponse | null>(null);
  const noteRef = useRef<HTMLTextAreaElement>(null);
  const worse = useReportWorse(caseId);

  const close = () => {
    setOpen(false);
    setError(undefined);
    worse.reset();
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (note.trim().length < 3) {
      setError("Tell us briefly what has changed.");
      noteRef.current?.focus();
      return;
    }
    worse.mutate(note.trim(), {
      onSuccess: (outcome) => {
        setNote("");
        setDone(outcome);
        setOpen(false);
        onReported?.();
      },
    });
  };

  return (
    <>
      <Button
        variant="secondary"
        onClick={() => {
          setDone(null);
          setOpen(true);
        }}
      >
        It's got worse
      </Button>
      {done ? (
        <Alert tone="success" title={outcomeWords(done).title} className="basis-full">
          {outcomeWords(done).body}
        </Alert>
      ) : null}
      <Modal
        open={open}
        onClose={close}
        title="Tell your landlord it has got worse"
        initialFocusRef={noteRef}
        busy={worse.isPending}
      >
        <form onSubmit={submit} noValidate className="flex flex-col gap-4">
          <Textarea
            ref={noteRef}
            label="What has changed?"
            hint="For example: the mould has spread to the wardrobe, or someone at home is now unwell."
            rows={4}
            maxLength={2000}
            value={note}
            onChange={(e) => {
              setNote(e.target.value);
              if (error) setError(undefined);
            }}
            error={error}
          />
          {worse.isError ? (
            <Alert tone="danger" title="This wasn't sent">
              {errorMessage(worse.error)}
            </Alert>
          ) : null}
          <div className="flex flex-wrap justify-end gap-2">
            <Button variant="secondary" onClick={close} disabled={worse.isPending}>
              Cancel
            </Button>
            <Button type="submit" busy={worse.isPending}>
              Send to my landlord
            </Button>
          </div>
        </form>
      </Modal>
    </>
  );
}
