import { useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { useStaff } from "@/lib/staff";
import { useContractors } from "@/lib/contractors";
import type { SlotWindow, WorkOrder, WorkOrderPatch } from "../api/types";
import { useUpdateWorkOrder } from "../api/update-work-order";
import { todayInLondon } from "@/lib/work-orders";
import { WINDOW_CHOICES, slotForStaff, workTypeLabel } from "../lib/labels";
import { checkSchedule, type ScheduleErrors, type ScheduleFields } from "../lib/work-order-forms";
import { Modal } from "@/components/ui/modal";
import { RadioGroup } from "@/components/ui/option-radio-group";

interface ScheduleDialogProps {
  order: WorkOrder;
  open: boolean;
  onClose: () => void;
  onDone: (message: string) => void;
}

const WHO_CHOICES = [
  { value: "operative" as const, label: "One of our operatives" },
  { value: "contractor" as const, label: "A contractor" },
];

const initialFields = (o: WorkOrder): ScheduleFields => ({
  who: o.contractor ? "contractor" : "operative",
  assigneeId: o.assignee ? String(o.assignee.id) : "",
  contractorId: o.contractor ? String(o.contractor.id) : "",
  date: "",
  window: "",
});

/** Who does the work and when: the tenant is sent the offered appointment. */
export function ScheduleDialog({ order, open, onClose, onDone }: ScheduleDialogProps) {
  return (
    <Modal open={open} onClose={onClose} title={`${order.slot ? "Reschedule" : "Schedule"}: ${workTypeLabel(order.type)}`}>
      {open ? <ScheduleForm order={order} onClose={onClose} onDone={onDone} /> : null}
    </Modal>
  );
}

function ScheduleForm({ order, onClose, onDone }: Omit<ScheduleDialogProps, "open">) {
  const update = useUpdateWorkOrder(order.caseId, order.id, "schedule");
  const staff = useStaff();
  const [fields, setFields] = useState<ScheduleFields>(() => initialFields(order));
  const contractors = useContractors({ enabled: fields.who === "contractor" });
  const [errors, setErrors] = useState<ScheduleErrors>({});
  const whoRef = useRef<HTMLSelectElement>(null);
  const dateRef = useRef<HTMLInputElement>(null);
  const windowRef = useRef<HTMLInputElement>(null);
  const today = todayInLondon();
  const operatives = (staff.data ?? []).filter((s) => s.role === "maintenance");

  const set = <K extends keyof ScheduleFields>(key: K, value: ScheduleFields[K]) => {
    update.reset();
    setFields((f) => ({ ...f, [key]: value }));
    setErrors({});
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = checkSchedule(fields, today);
    setErrors(found);
    if (found.assignee) return whoRef.current?.focus();
    if (found.date) return dateRef.current?.focus();
    if (found.window) return windowRef.current?.focus();
    const slot = { date: fields.date, window: fields.window as SlotWindow };
    const patch: WorkOrderPatch = fields.who === "operative" ? { assigneeId: Number(fields.assigneeId), slot } : { contractorId: Number(fields.contractorId), slot };
    const name =
      fields.who === "operative"
        ? operatives.find((s) => String(s.id) === fields.assigneeId)?.name
        : contractors.data?.find((c) => String(c.id) === fields.contractorId)?.name;
    update.mutate(patch, {
      // A 409 (already booked) keeps the dialog open with the server's message.
      onSuccess: () => onDone(`Booked ${name ?? "the visit"} for ${slotForStaff(slot)}. The tenant has been asked to confirm.`),
    });
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <RadioGroup legend="Who will do the work" options={WHO_CHOICES} value={fields.who} onChange={(v) => set("who", v)} columns={2} />
      {fields.who === "operative" ? (
        staff.isPending ? (
          <LoadingState className="py-2">Loading operatives…</LoadingState>
        ) : staff.isError ? (
          <Alert tone="warning" title="We couldn't load the operatives">
            {errorMessage(staff.error)}
          </Alert>
        ) : (
          <Select ref={whoRef} label="Operative" value={fields.assigneeId} error={errors.assignee} onChange={(e) => set("assigneeId", e.target.value)}>
            <option value="">Choose an operative</option>
            {operatives.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}
              </option>
            ))}
          </Select>
        )
      ) : contractors.isPending ? (
        <LoadingState className="py-2">Loading contractors…</LoadingState>
      ) : contractors.isError ? (
        <Alert tone="warning" title="We couldn't load the contractors">
          {errorMessage(contractors.error)}
        </Alert>
      ) : contractors.data.length === 0 ? (
        <p className="text-ink-soft">No contractors on record yet. A maintenance lead or administrator can add them.</p>
      ) : (
        <Select ref={whoRef} label="Contractor" value={fields.contractorId} error={errors.assignee} onChange={(e) => set("contractorId", e.target.value)}>
          <option value="">Choose a contractor</option>
          {contractors.data.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
              {c.trade ? `, ${c.trade}` : ""}
            </option>
          ))}
        </Select>
      )}
      <Input ref={dateRef} type="date" label="Day" min={today} value={fields.date} error={errors.date} onChange={(e) => set("date", e.target.value)} controlClassName="sm:max-w-xs" />
      <RadioGroup<SlotWindow> legend="Time of day" hint="UK time." options={WINDOW_CHOICES} value={fields.window} onChange={(v) => set("window", v)} error={errors.window} inputRef={windowRef} columns={3} />
      {update.isError ? (
        <Alert tone="danger" title="The visit was not booked">
          {errorMessage(update.error)}
        </Alert>
      ) : null}
      <div className="flex flex-wrap justify-end gap-2">
        <Button variant="secondary" onClick={onClose} disabled={update.isPending}>
          Cancel
        </Button>
        <Button type="submit" busy={update.isPending}>
          Book the visit
        </Button>
      </div>
    </form>
  );
}
