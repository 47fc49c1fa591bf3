import { useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import type { WorkOrder } from "../api/case-types";
import { useUpdateWorkOrder } from "../api/update-work-order";
import { workTypeLabel } from "../lib/words";
import { Modal } from "@/components/ui/modal";

interface CancelDialogProps {
  order: WorkOrder;
  open: boolean;
  onClose: () => void;
  onDone: (message: string) => void;
}

/** Cancelling needs a reason, and this dialog is the confirmation: nothing is sent before its button. */
export function CancelDialog({ order, open, onClose, onDone }: CancelDialogProps) {
  return (
    <Modal open={open} onClose={onClose} title={`Cancel this work order? ${workTypeLabel(order.type)}`}>
      {open ? <CancelForm order={order} onClose={onClose} onDone={onDone} /> : null}
    </Modal>
  );
}

function CancelForm({ order, onClose, onDone }: Omit<CancelDialogProps, "open">) {
  const update = useUpdateWorkOrder(order.caseId, order.id, "cancel");
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | undefined>();
  const ref = useRef<HTMLTextAreaElement>(null);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const trimmed = reason.trim();
    if (trimmed.length < 3) {
      setError("Say why the work order is being cancelled.");
      return ref.current?.focus();
    }
    update.mutate({ cancel: { reason: trimmed } }, { onSuccess: () => onDone("The work order was cancelled.") });
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <p>
        {order.slot ? "The booked visit is called off and the tenant is told. " : ""}A cancelled order cannot be reopened: add a
        new one if the work is needed after all.
      </p>
      <Textarea
        ref={ref}
        label="Reason for cancelling"
        hint="Staff see it in the timeline."
        rows={2}
        maxLength={2000}
        value={reason}
        error={error}
        onChange={(e) => {
          setReason(e.target.value);
          setError(undefined);
          update.reset();
        }}
      />
      {update.isError ? (
        <Alert tone="danger" title="The work order was not cancelled">
          {errorMessage(update.error)}
        </Alert>
      ) : null}
      <div className="flex flex-wrap justify-end gap-2">
        <Button variant="secondary" onClick={onClose} disabled={update.isPending}>
          Keep the order
        </Button>
        <Button type="submit" variant="danger" busy={update.isPending}>
          Cancel the order
        </Button>
      </div>
    </form>
  );
}
