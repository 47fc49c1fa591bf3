import { useId, useRef, useState, type FormEvent } from "react";
import { Modal } from "@/components/ui/modal";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { FieldError, Input, Select } from "@/components/ui/field";
import { errorMessage, isApiError } from "@/lib/api-client";
import { useStaff } from "@/lib/staff";
import { useContractors } from "@/lib/contractors";
import { useScheduleWorkOrder } from "../api/schedule-work-order";
import { SLOT_WINDOWS, type ScheduleBody, type SlotWindow, type WorkOrder } from "../api/types";
import { isFanWork } from "@/lib/extract-rates";
import { labelFor, orderReference, typeLabels, windowLabels, windowShortLabels } from "../lib/labels";
import { formatLongDate, formatShortDate, isIsoDate, todayInLondon } from "../lib/week";
import { FanGuidance } from "./fan-guidance";

/** Scheduling again replaces a booking; an order with no slot is booked for the first time. */
export const isReschedule = (order: Pick<WorkOrder, "slot">) => order.slot !== null;

/** The orders that can be booked or rebooked from the Works page. */
export const canSchedule = (order: Pick<WorkOrder, "status">) => ["unscheduled", "scheduled", "change-requested", "confirmed"].includes(order.status);

interface ScheduleDialogProps {
  /** The order to book; null keeps the dialog closed. */
  order: WorkOrder | null;
  onClose: () => void;
  onScheduled?: (order: WorkOrder) => void;
}

interface Errors {
  who?: string;
  date?: string;
  window?: string;
}

const whoOf = (order: WorkOrder) => (order.assignee ? `operative:${order.assignee.id}` : order.contractor ? `contractor:${order.contractor.id}` : "");

/**
 * Books an operative or a contractor for a work order: who, which day (today or later) and which
 * half of it. A clash with another booking (409) is shown here, and the dialog stays open so
 * another slot or person can be chosen.
 */
export function ScheduleDialog({ order, onClose, onScheduled }: ScheduleDialogProps) {
  const rebooking = order ? isReschedule(order) : false;
  return (
    <Modal open={order !== null} onClose={onClose} title={order ? `${rebooking ? "Reschedule" : "Schedule"} ${orderReference(order)}` : ""}>
      {order ? <ScheduleForm key={order.id} order={order} onClose={onClose} onScheduled={onScheduled} /> : null}
    </Modal>
  );
}

function ScheduleForm({ order, onClose, onScheduled }: { order: WorkOrder; onClose: () => void; onScheduled?: (order: WorkOrder) => void }) {
  const staff = useStaff();
  const contractors = useContractors();
  const schedule = useScheduleWorkOrder();
  const today = todayInLondon();
  const rebooking = isReschedule(order);
  const operatives = (staff.data ?? []).filter((p) => p.role === "maintenance");

  const [who, setWho] = useState(whoOf(order));
  const [date, setDate] = useState(order.slot && order.slot.date >= today ? order.slot.date : "");
  const [slotWindow, setSlotWindow] = useState<SlotWindow | "">(order.slot?.window ?? "");
  const [errors, setErrors] = useState<Errors>({});
  const whoRef = useRef<HTMLSelectElement>(null);
  const dateRef = useRef<HTMLInputElement>(null);
  const windowRef = useRef<HTMLInputElement>(null);
  const windowId = useId();

  const busy = schedule.isPending;
  const clash = schedule.isError && isApiError(schedule.error) && schedule.error.status === 409;

  const change = <T,>(set: (v: T) => void) => (value: T) => {
    set(value);
    if (schedule.isError) schedule.reset();
  };

  const submit = (event: FormEvent) => {
    event.preventDefault();
    const next: Errors = {};
    if (!who) next.who = "Choose an operative or a contractor.";
    if (!date) next.date = "Choose the day of the visit.";
    else if (!isIsoDate(date)) next.date = "Enter a real date.";
    else if (date < today) next.date = "Choose today or a later day: a visit cannot be booked in the past.";
    if (!slotWindow) next.window = "Choose the morning, the afternoon or all day.";
    setErrors(next);
    if (next.who) return whoRef.current?.focus();
    if (next.date) return dateRef.current?.focus();
    if (next.window) return windowRef.current?.focus();

    const [kind, id] = who.split(":");
    const slot = { date, window: slotWindow as SlotWindow };
    const body: ScheduleBody = kind === "contractor" ? { contractorId: Number(id), slot } : { assigneeId: Number(id), slot };
    schedule.mutate(
      { id: order.id, body },
      {
        onSuccess: (updated) => {
          onScheduled?.(updated);
          onClose();
        },
      },
    );
  };

  const current = order.slot;
  const currentWho = order.assignee?.name ?? order.contractor?.name;

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <div className="flex flex-col gap-1">
        <p>
          <span className="font-semibold">{labelFor(typeLabels, order.type)}</span> at {order.property.addressLine1}, {order.property.town}{" "}
          <span className="whitespace-nowrap">{order.property.postcode}</span>
        </p>
        <p className="text-ink-soft">{order.description}</p>
        <p className="text-sm">
          To be done by <strong>{formatShortDate(order.targetDate)}</strong>
        </p>
      </div>

      {current ? (
        <Alert tone="info" live="none" title="Booked now">
          <p>
            {formatLongDate(current.date)}, {windowLabels[current.window].toLowerCase()}
            {currentWho ? `, ${currentWho}` : ""}.
          </p>
          {order.booking?.response === "change-requested" || order.status === "change-requested" ? (
            <p className="mt-1">
              <strong>The tenant asked for another slot</strong>
              {order.booking?.reason ? `: “${order.booking.reason}”` : "."}
            </p>
          ) : null}
        </Alert>
      ) : null}

      {isFanWork(order.type) ? <FanGuidance /> : null}

      <Select
        ref={whoRef}
        label="Who will do it"
        value={who}
        error={errors.who}
        onChange={(e) => change(setWho)(e.target.value)}
        hint={staff.isError || contractors.isError ? "We could not load everyone; try again in a moment." : undefined}
      >
        <option value="">Choose an operative or a contractor</option>
        {operatives.length ? (
          <optgroup label="Operatives">
            {operatives.map((p) => (
              <option key={p.id} value={`operative:${p.id}`}>
                {p.name}
              </option>
            ))}
          </optgroup>
        ) : null}
        {contractors.data?.length ? (
          <optgroup label="Contractors">
            {contractors.data.map((c) => (
              <option key={c.id} value={`contractor:${c.id}`}>
                {c.name}
                {c.trade ? ` (${c.trade})` : ""}
              </option>
            ))}
          </optgroup>
        ) : null}
      </Select>

      <Input
        ref={dateRef}
        type="date"
        label="Day of the visit"
        min={today}
        value={date}
        error={errors.date}
        onChange={(e) => change(setDate)(e.target.value)}
        className="max-w-xs"
      />

      <fieldset aria-describedby={errors.window ? `${windowId}-error` : undefined} className="flex min-w-0 flex-col gap-2">
        <legend className="mb-1 font-semibold text-ink">Time of day</legend>
        {errors.window ? <FieldError id={`${windowId}-error`}>{errors.window}</FieldError> : null}
        <div className="flex flex-wrap gap-2">
          {SLOT_WINDOWS.map((w, i) => (
            <label
              key={w}
              className="flex cursor-pointer items-center gap-2 rounded-md border border-line-strong bg-surface px-3 py-2 hover:bg-dew-50 has-[:checked]:border-2 has-[:checked]:border-dew-700 has-[:checked]:bg-dew-50"
            >
              <input
                ref={i === 0 ? windowRef : undefined}
                type="radio"
                name={windowId}
                value={w}
                checked={slotWindow === w}
                onChange={() => change(setSlotWindow)(w)}
                aria-invalid={errors.window ? true : undefined}
                className="size-5 shrink-0 accent-dew-700"
              />
              {windowShortLabels[w]}
            </label>
          ))}
        </div>
      </fieldset>

      {schedule.isError ? (
        <Alert tone="danger" title={clash ? "That slot is already taken" : "The booking was not made"}>
          <p>{errorMessage(schedule.error)}</p>
        </Alert>
      ) : null}

      <p className="text-sm text-ink-soft">The tenant is asked to confirm the slot or to ask for another one.</p>

      <div className="flex flex-wrap justify-end gap-2">
        <Button variant="secondary" onClick={onClose} disabled={busy}>
          Cancel
        </Button>
        <Button type="submit" busy={busy}>
          {rebooking ? "Reschedule" : "Book this slot"}
        </Button>
      </div>
    </form>
  );
}
