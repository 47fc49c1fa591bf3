import { useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import type { WorkOrder } from "../api/case-types";
import { useUpdateWorkOrder } from "../api/update-work-order";
import { workTypeLabel } from "../lib/words";
import { blankCompletion, checkCompletion, type CompletionErrors, type CompletionFields } from "../lib/work-order-forms";
import { Modal } from "@/components/ui/modal";

interface CompletionDialogProps {
  order: WorkOrder;
  open: boolean;
  onClose: () => void;
  onDone: (message: string) => void;
}

/** What was done on site. The after-photos are added once the completion is recorded. */
export function CompletionDialog({ order, open, onClose, onDone }: CompletionDialogProps) {
  return (
    <Modal open={open} onClose={onClose} title={`Record completion: ${workTypeLabel(order.type)}`}>
      {open ? <CompletionForm order={order} onClose={onClose} onDone={onDone} /> : null}
    </Modal>
  );
}

function CompletionForm({ order, onClose, onDone }: Omit<CompletionDialogProps, "open">) {
  const update = useUpdateWorkOrder(order.caseId, order.id, "complete");
  const [fields, setFields] = useState<CompletionFields>(blankCompletion);
  const [errors, setErrors] = useState<CompletionErrors>({});
  const noteRef = useRef<HTMLTextAreaElement>(null);
  const minutesRef = useRef<HTMLInputElement>(null);

  const set = (key: keyof CompletionFields, value: string) => {
    update.reset();
    setFields((f) => ({ ...f, [key]: value }));
    if (errors[key]) setErrors((e) => ({ ...e, [key]: undefined }));
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const { input, errors: found } = checkCompletion(fields);
    setErrors(found);
    if (found.note) return noteRef.current?.focus();
    if (found.minutesOnSite) return minutesRef.current?.focus();
    if (!input) return;
    update.mutate({ complete: input }, { onSuccess: () => onDone("Completion recorded. You can add the after-photos now.") });
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <Textarea
        ref={noteRef}
        label="What was done"
        hint="In a sentence or two. The officer and the tenant read it."
        rows={4}
        maxLength={8000}
        value={fields.note}
        error={errors.note}
        onChange={(e) => set("note", e.target.value)}
      />
      <Textarea
        label="Materials used"
        optional
        rows={2}
        maxLength={4000}
        value={fields.materials}
        onChange={(e) => set("materials", e.target.value)}
      />
      <Input
        ref={minutesRef}
        label="Time on site (minutes)"
        optional
        inputMode="numeric"
        value={fields.minutesOnSite}
        error={errors.minutesOnSite}
        onChange={(e) => set("minutesOnSite", e.target.value)}
        controlClassName="sm:max-w-[10rem]"
      />
      <Textarea
        label="Follow-on work found"
        optional
        hint="Anything else the home needs; the officer decides whether to order it."
        rows={2}
        maxLength={4000}
        value={fields.followOn}
        onChange={(e) => set("followOn", e.target.value)}
      />
      {update.isError ? (
        <Alert tone="danger" title="The completion was not recorded">
          {errorMessage(update.error)}
        </Alert>
      ) : null}
      <div className="flex flex-wrap justify-end gap-2">
        <Button variant="secondary" onClick={onClose} disabled={update.isPending}>
          Cancel
        </Button>
        <Button type="submit" busy={update.isPending}>
          Record completion
        </Button>
      </div>
    </form>
  );
}
