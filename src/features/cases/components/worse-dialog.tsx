import { useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { useReportWorse } from "../api/report-worse";
import { Modal } from "./modal";

interface WorseButtonProps {
  caseId: number;
  onReported?: () => void;
}

/** "It's got worse": a short note to the landlord, added to the timeline. */
export function WorseButton({ caseId, onReported }: WorseButtonProps) {
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | undefined>();
  const [done, setDone] = useState(false);
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
      onSuccess: () => {
        setNote("");
        setDone(true);
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
          setDone(false);
          setOpen(true);
        }}
      >
        It's got worse
      </Button>
      {done ? (
        <Alert tone="success" title="Thank you, your landlord has been told" className="basis-full">
          What you wrote is now part of your report.
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
