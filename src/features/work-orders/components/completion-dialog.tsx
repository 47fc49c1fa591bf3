import { useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select, Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { formatCalendarLong } from "@/lib/dates";
import { WORK_ORDER_TYPES, type WorkOrder, type WorkOrderType } from "../api/case-types";
import { useUpdateWorkOrder } from "../api/update-work-order";
import { WORK_TYPE_WORDS, workTypeLabel } from "../lib/words";
import {
  blankCompletion,
  checkCompletion,
  doneEarly,
  type CompletionErrors,
  type CompletionFields,
} from "../lib/work-order-forms";
import { todayInLondon } from "../lib/work-orders";
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
  const doneOnRef = useRef<HTMLInputElement>(null);
  const earlyRef = useRef<HTMLTextAreaElement>(null);
  const today = todayInLondon();
  const bookedOn = order.slot?.date ?? null;
  const early = doneEarly(fields, bookedOn);

  const set = <K extends keyof CompletionFields>(key: K, value: CompletionFields[K]) => {
    update.reset();
    setFields((f) => ({ ...f, [key]: value }));
    if (errors[key]) setErrors((e) => ({ ...e, [key]: undefined }));
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const { input, errors: found } = checkCompletion(fields, { today, bookedOn });
    setErrors(found);
    if (found.doneOn) return doneOnRef.current?.focus();
    if (found.earlyReason) return earlyRef.current?.focus();
    if (found.note) return noteRef.current?.focus();
    if (found.minutesOnSite) return minutesRef.current?.focus();
    if (!input) return;
    update.mutate(
      { complete: input },
      {
        onSuccess: () =>
          onDone(
            input.followOn
              ? "Completion recorded. A new work order was added for the follow-on work: book it, or cancel it with a reason. You can add the after-photos now."
              : "Completion recorded. You can add the after-photos now.",
          ),
      },
    );
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <Input
        ref={doneOnRef}
        type="date"
        label="Day the work was done"
        hint={
          bookedOn
            ? `The visit was booked for ${formatCalendarLong(bookedOn)}. Today or an earlier day.`
            : "Today or an earlier day."
        }
        max={today}
        value={fields.doneOn}
        error={errors.doneOn}
        onChange={(e) => set("doneOn", e.target.value)}
        controlClassName="sm:max-w-xs"
      />
      {early ? (
        <Textarea
          ref={earlyRef}
          label="Why was it done before the booked day?"
          hint="For the record: staff read it, the tenant does not. For example, the tenant asked for an earlier visit."
          rows={2}
          maxLength={2000}
          value={fields.earlyReason}
          error={errors.earlyReason}
          onChange={(e) => set("earlyReason", e.target.value)}
        />
      ) : null}
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
        hint="Anything else the home needs. A new work order is added for it, so the case stays open until it is done or cancelled."
        rows={2}
        maxLength={4000}
        value={fields.followOn}
        onChange={(e) => set("followOn", e.target.value)}
      />
      {fields.followOn.trim() ? (
        <Select
          label="Type of the follow-on work"
          value={fields.followOnType}
          onChange={(e) => set("followOnType", e.target.value as WorkOrderType | "")}
          controlClassName="sm:max-w-md"
        >
          <option value="">Other repair work</option>
          {WORK_ORDER_TYPES.filter((t) => t !== "other").map((t) => (
            <option key={t} value={t}>
              {WORK_TYPE_WORDS[t].label}
            </option>
          ))}
        </Select>
      ) : null}
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
