// Booking from a free slot of the week board: first the order to book into it, then the schedule
// dialog with who, the day and the time of day already filled in.
import { useId, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Modal } from "@/components/ui/modal";
import { RadioGroup } from "@/components/ui/option-radio-group";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { formatCalendarLong } from "@/lib/dates";
import { useWorkOrders } from "../api/get-work-orders";
import type { WorkOrder } from "../api/types";
import { labelFor, orderReference, typeLabels, windowLabels } from "../lib/labels";
import type { OrderListParams } from "../lib/works-view";
import type { SlotPreset } from "./schedule-dialog";

/** The orders still to book (and those whose tenant asked for another time), soonest target first. */
const TO_BOOK: OrderListParams = {
  status: ["unscheduled", "change-requested"],
  type: "",
  assignee: "",
  sort: "target",
  order: "asc",
  page: 1,
  pageSize: 100,
};

interface SlotOrderPickerProps {
  /** The free slot chosen; null keeps the dialog closed. */
  slot: (SlotPreset & { who: string }) | null;
  onClose: () => void;
  onPick: (order: WorkOrder) => void;
}

export const slotWords = (slot: SlotPreset & { who: string }) =>
  `${slot.who}, ${formatCalendarLong(slot.date)}, ${labelFor(windowLabels, slot.window).toLowerCase()}`;

export function SlotOrderPicker({ slot, onClose, onPick }: SlotOrderPickerProps) {
  return (
    <Modal open={slot !== null} onClose={onClose} title="Book this free slot">
      {slot ? (
        <Picker key={`${slot.assigneeId}|${slot.date}|${slot.window}`} slot={slot} onClose={onClose} onPick={onPick} />
      ) : null}
    </Modal>
  );
}

function Picker({ slot, onClose, onPick }: SlotOrderPickerProps & { slot: NonNullable<SlotOrderPickerProps["slot"]> }) {
  const orders = useWorkOrders(TO_BOOK);
  const [chosen, setChosen] = useState("");
  const [error, setError] = useState<string>();
  const hintId = useId();
  const items = orders.data?.items ?? [];

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const order = items.find((o) => String(o.id) === chosen);
    if (!order) return setError("Choose the work order to book into this slot.");
    onPick(order);
  };

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4" aria-describedby={hintId}>
      <p id={hintId}>
        <strong>{slotWords(slot)}</strong>. Choose the order to book; you check the details on the next step.
      </p>
      {orders.isPending ? (
        <LoadingState className="py-2">Loading the orders to book…</LoadingState>
      ) : orders.isError ? (
        <Alert tone="danger" title="We could not load the orders to book">
          {errorMessage(orders.error)}
        </Alert>
      ) : items.length === 0 ? (
        <p className="text-ink-soft">Every open order is booked. New orders appear here once an officer asks for work.</p>
      ) : (
        <RadioGroup
          legend="Work order"
          options={items.map((o) => ({
            value: String(o.id),
            label: `${orderReference(o)}: ${labelFor(typeLabels, o.type)}`,
            hint: `${o.property.addressLine1}${o.status === "change-requested" ? " · the tenant asked for another time" : ""}`,
          }))}
          value={chosen}
          onChange={(v) => {
            setChosen(v);
            setError(undefined);
          }}
          error={error}
        />
      )}
      <div className="flex flex-wrap justify-end gap-2">
        <Button variant="secondary" onClick={onClose}>
          Cancel
        </Button>
        <Button type="submit" disabled={items.length === 0}>
          Continue
        </Button>
      </div>
    </form>
  );
}
