import { useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import type { ComplaintResponse } from "@/lib/contracts";
import { useSetRemedy } from "../api/set-remedy";
import { penceFrom } from "../lib/labels";

const pounds = (pence: number | null) => (pence === null ? "" : (pence / 100).toFixed(2));

/** The remedy: an apology, what will be put right, and compensation offered, accepted and paid (amounts in pounds, stored in pence). */
export function RemedyForm({ complaint }: { complaint: ComplaintResponse }) {
  const r = complaint.remedy;
  const save = useSetRemedy(complaint.caseId, complaint.id);
  const [apology, setApology] = useState(r.apology);
  const [apologyText, setApologyText] = useState(r.apologyText ?? "");
  const [putRight, setPutRight] = useState(r.putRight ?? "");
  const [offered, setOffered] = useState(pounds(r.compensationOfferedPence));
  const [offeredOn, setOfferedOn] = useState(r.compensationOfferedOn ?? "");
  const [acceptedOn, setAcceptedOn] = useState(r.compensationAcceptedOn ?? "");
  const [paid, setPaid] = useState(pounds(r.compensationPaidPence));
  const [paidOn, setPaidOn] = useState(r.compensationPaidOn ?? "");
  const [amountError, setAmountError] = useState<string | undefined>();

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const offeredPence = penceFrom(offered);
    const paidPence = penceFrom(paid);
    if (Number.isNaN(offeredPence) || Number.isNaN(paidPence))
      return setAmountError("Write amounts in pounds, like 150 or 150.50.");
    setAmountError(undefined);
    save.mutate({
      version: complaint.version,
      apology,
      apologyText: apology && apologyText.trim() ? apologyText.trim() : null,
      putRight: putRight.trim() || null,
      compensationOfferedPence: offeredPence,
      compensationOfferedOn: offeredOn || null,
      compensationAcceptedOn: acceptedOn || null,
      compensationPaidPence: paidPence,
      compensationPaidOn: paidOn || null,
      note: null,
    });
  };
  return (
    <form onSubmit={submit} className="flex flex-col gap-3" noValidate>
      <label className="flex items-center gap-2">
        <input type="checkbox" checked={apology} onChange={(e) => setApology(e.target.checked)} />
        We apologise
      </label>
      {apology ? (
        <Textarea
          label="The apology's words"
          optional
          value={apologyText}
          onChange={(e) => setApologyText(e.target.value)}
          rows={2}
        />
      ) : null}
      <Textarea label="What will be put right" optional value={putRight} onChange={(e) => setPutRight(e.target.value)} rows={2} />
      <div className="grid gap-3 sm:grid-cols-2">
        <Input
          label="Compensation offered (£)"
          optional
          inputMode="decimal"
          value={offered}
          onChange={(e) => setOffered(e.target.value)}
          error={amountError}
        />
        <Input label="Offered on" optional type="date" value={offeredOn} onChange={(e) => setOfferedOn(e.target.value)} />
        <Input label="Accepted on" optional type="date" value={acceptedOn} onChange={(e) => setAcceptedOn(e.target.value)} />
        <span />
        <Input
          label="Compensation paid (£)"
          optional
          inputMode="decimal"
          value={paid}
          onChange={(e) => setPaid(e.target.value)}
        />
        <Input label="Paid on" optional type="date" value={paidOn} onChange={(e) => setPaidOn(e.target.value)} />
      </div>
      {save.isError ? (
        <Alert tone="danger" live="alert">
          {errorMessage(save.error)}
        </Alert>
      ) : null}
      {save.isSuccess ? (
        <Alert tone="success" live="status">
          Remedy saved.
        </Alert>
      ) : null}
      <div>
        <Button type="submit" variant="secondary" busy={save.isPending}>
          Save the remedy
        </Button>
      </div>
    </form>
  );
}
