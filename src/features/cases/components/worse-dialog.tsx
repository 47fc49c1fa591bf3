import { useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import type { WorseResponse } from "@/lib/contracts";
import { useReportWorse } from "../api/report-worse";
import { Modal } from "./modal";
import { useCaseText } from "../tenant-words";
import type { TFunction } from "i18next";

interface WorseButtonProps {
  caseId: number;
  onReported?: () => void;
}

/**
 * What the tenant is told afterwards: only what happened. "Told" only when someone was e-mailed;
 * "reopened" only when a finished or monitored report was reopened.
 */
function outcomeWords(t: TFunction<"case">, outcome: WorseResponse): { title: string; body: string } {
  const reopened = outcome.reopened ? t("worse.reopened") : "";
  if (outcome.told === "nobody") return { title: t("worse.partTitle"), body: t("worse.partBody", { reopened }) };
  return { title: t("worse.toldTitle"), body: t("worse.toldBody", { who: outcome.told, reopened }) };
}

/** "It's got worse": a short note to the landlord, added to the timeline. */
export function WorseButton({ caseId, onReported }: WorseButtonProps) {
  const [open, setOpen] = useState(false);
  const [note, setNote] = useState("");
  const [error, setError] = useState<string | undefined>();
  const [done, setDone] = useState<WorseResponse | null>(null);
  const noteRef = useRef<HTMLTextAreaElement>(null);
  const worse = useReportWorse(caseId);
  const { t } = useCaseText();

  const close = () => {
    setOpen(false);
    setError(undefined);
    worse.reset();
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    if (note.trim().length < 3) {
      setError(t("worse.tooShort"));
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
        {t("worse.button")}
      </Button>
      {done ? (
        <Alert tone="success" title={outcomeWords(t, done).title} className="basis-full">
          {outcomeWords(t, done).body}
        </Alert>
      ) : null}
      <Modal open={open} onClose={close} title={t("worse.title")} initialFocusRef={noteRef} busy={worse.isPending}>
        <form onSubmit={submit} noValidate className="flex flex-col gap-4">
          <Textarea
            ref={noteRef}
            label={t("worse.label")}
            hint={t("worse.hint")}
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
            <Alert tone="danger" title={t("worse.notSent")}>
              <span translate="no">{errorMessage(worse.error)}</span>
            </Alert>
          ) : null}
          <div className="flex flex-wrap justify-end gap-2">
            <Button variant="secondary" onClick={close} disabled={worse.isPending}>
              {t("worse.cancel")}
            </Button>
            <Button type="submit" busy={worse.isPending}>
              {t("worse.send")}
            </Button>
          </div>
        </form>
      </Modal>
    </>
  );
}
