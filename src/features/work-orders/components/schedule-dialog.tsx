// The one dialog that books (or rebooks) a work order into an operative's or a contractor's slot,
// used on the /works page and in the case workspace. It sends PATCH /api/work-orders/:id itself and
// refreshes what the booking changes; the screen that opens it says what to do once it is booked.
import { useRef, useState, type FormEvent } from "react";
import { useMutation, useQueryClient, type QueryClient } from "@tanstack/react-query";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { Modal } from "@/components/ui/modal";
import { RadioGroup, type RadioChoice } from "@/components/ui/option-radio-group";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage, isApiError } from "@/lib/api-client";
import { formatCalendarLong } from "@/lib/dates";
import { caseKeys, workOrderKeys } from "@/lib/query-keys";
import { useContractors } from "@/lib/contractors";
import { isFanWork } from "@/lib/extract-rates";
import { useStaff } from "@/lib/staff";
import {
  SLOT_WINDOWS,
  isIsoDate,
  patchWorkOrder,
  todayInLondon,
  windowHours,
  windowNames,
  workTypeNames,
  type ScheduleBody,
  type SlotWindow,
} from "../lib/work-orders";
import { FanGuidance } from "./fan-guidance";

/** What the dialog reads of an order: both the /works page's and the case's order shapes fit. */
export interface SchedulableOrder {
  id: number;
  caseId: number;
  caseReference: string | null;
  status: string;
  type: string;
  /** Staff only (the tenant never receives it). */
  description?: string;
  /** YYYY-MM-DD, when there is one. */
  targetDate: string | null;
  property?: { addressLine1?: string; town?: string; postcode?: string };
  assignee: { id: number; name: string } | null;
  contractor: { id: number; name: string } | null;
  slot: { date: string; window: string } | null;
  booking: { response: string | null; reason: string | null } | null;
}

interface ScheduleDialogProps<O extends SchedulableOrder> {
  /** The order to book; null keeps the dialog closed. */
  order: O | null;
  onClose: () => void;
  /** Called with the order as the server returns it, once booked (the dialog then closes). */
  onScheduled?: (order: O) => void;
  /** A free slot chosen on the week board: who, which day and which part of it, filled in. */
  preset?: SlotPreset;
}

/** A free slot of the week board, to start the booking from. */
export interface SlotPreset {
  /** An operative's user id, or null for the contractors' row. */
  assigneeId: number | null;
  date: string;
  window: SlotWindow;
}

type Who = "operative" | "contractor";

const WHO_CHOICES: readonly RadioChoice<Who>[] = [
  { value: "operative", label: "One of our operatives" },
  { value: "contractor", label: "A contractor" },
];

const WINDOW_CHOICES: readonly RadioChoice<SlotWindow>[] = SLOT_WINDOWS.map((w) => ({
  value: w,
  label: windowNames[w],
  hint: windowHours[w],
}));

const isWindow = (w: string): w is SlotWindow => (SLOT_WINDOWS as readonly string[]).includes(w);

/** A Saturday or a Sunday (a calendar date, read as UTC so no time zone shifts it). */
const isWeekend = (date: string) => [0, 6].includes(new Date(`${date}T12:00:00Z`).getUTCDay());

/** "Tuesday 8 December 2026" from "2026-12-08" (never shifted a day). */
const formatDate = (date: string) => formatCalendarLong(date);

const typeName = (type: string) => workTypeNames[type as keyof typeof workTypeNames] ?? type;

export const orderReference = (order: Pick<SchedulableOrder, "caseReference" | "caseId">) =>
  order.caseReference ?? `Case ${order.caseId}`;

interface Fields {
  who: Who;
  assigneeId: string;
  contractorId: string;
  date: string;
  window: SlotWindow | "";
}

type Errors = Partial<Record<"who" | "date" | "window", string>>;

/** The same rules as the server's schema (server/modules/works/works.schemas.ts), in words that say what to do. */
export function checkSchedule(f: Fields, today: string = todayInLondon()): Errors {
  const errors: Errors = {};
  if (f.who === "operative" && !f.assigneeId) errors.who = "Choose the operative who will do the work.";
  if (f.who === "contractor" && !f.contractorId) errors.who = "Choose the contractor who will do the work.";
  if (!f.date) errors.date = "Choose the day of the visit.";
  else if (!isIsoDate(f.date)) errors.date = "Enter a real date.";
  else if (f.date < today) errors.date = "Choose today or a later day: a visit cannot be booked in the past.";
  // Bank holidays are refused by the server with their name (the holiday data stays out of the browser).
  else if (isWeekend(f.date)) errors.date = "Choose a weekday: visits are not booked at weekends.";
  if (!f.window) errors.window = "Choose the morning, the afternoon or all day.";
  return errors;
}

const initialFields = (o: SchedulableOrder, today: string, preset?: SlotPreset): Fields =>
  preset
    ? {
        who: preset.assigneeId === null ? "contractor" : "operative",
        assigneeId: preset.assigneeId === null ? "" : String(preset.assigneeId),
        contractorId: o.contractor ? String(o.contractor.id) : "",
        date: preset.date,
        window: preset.window,
      }
    : {
        who: o.contractor ? "contractor" : "operative",
        assigneeId: o.assignee ? String(o.assignee.id) : "",
        contractorId: o.contractor ? String(o.contractor.id) : "",
        // Rebooking starts from the current slot, unless it has passed.
        date: o.slot && o.slot.date >= today ? o.slot.date : "",
        window: o.slot && isWindow(o.slot.window) ? o.slot.window : "",
      };

/** A case's queries that describe the case itself, not its readings, evaluation or photos. */
const CASE_PARTS_UNCHANGED = new Set(["readings", "evaluation", "photos"]);

/**
 * What a booking changes: every list of work orders (the /works table and week board), the lists of
 * cases (the queue, the tenant's cases: booking moves an investigated case on to works planned) and
 * the case's own queries (its status, timeline, deadlines, triage and work orders).
 */
export function refreshAfterBooking(queryClient: QueryClient, caseId: number): Promise<unknown> {
  const thisCase = caseKeys.detail(caseId);
  return Promise.all([
    queryClient.invalidateQueries({ queryKey: workOrderKeys.all }),
    queryClient.invalidateQueries({ queryKey: caseKeys.lists() }),
    queryClient.invalidateQueries({
      queryKey: thisCase,
      predicate: ({ queryKey }) => !CASE_PARTS_UNCHANGED.has(String(queryKey[thisCase.length])),
    }),
  ]);
}

/**
 * Books an operative or a contractor for a work order: who, which day (today or later) and which
 * part of it. Rebooking shows the current slot. A clash with another booking (409) is shown here,
 * and the dialog stays open so another slot or person can be chosen.
 */
export function ScheduleDialog<O extends SchedulableOrder>({ order, onClose, onScheduled, preset }: ScheduleDialogProps<O>) {
  return (
    <Modal
      open={order !== null}
      onClose={onClose}
      title={order ? `${order.slot ? "Reschedule" : "Schedule"} ${orderReference(order)}` : ""}
    >
      {order ? <ScheduleForm key={order.id} order={order} onClose={onClose} onScheduled={onScheduled} preset={preset} /> : null}
    </Modal>
  );
}

function ScheduleForm<O extends SchedulableOrder>({
  order,
  onClose,
  onScheduled,
  preset,
}: ScheduleDialogProps<O> & { order: O }) {
  const queryClient = useQueryClient();
  const today = todayInLondon();
  const [fields, setFields] = useState<Fields>(() => initialFields(order, today, preset));
  const [errors, setErrors] = useState<Errors>({});
  const staff = useStaff();
  const contractors = useContractors({ enabled: fields.who === "contractor" });
  const schedule = useMutation({
    mutationFn: (body: ScheduleBody) => patchWorkOrder<O>(order.id, body),
    onSuccess: () => refreshAfterBooking(queryClient, order.caseId),
  });
  const whoRef = useRef<HTMLSelectElement>(null);
  const dateRef = useRef<HTMLInputElement>(null);
  const windowRef = useRef<HTMLInputElement>(null);
  const operatives = (staff.data ?? []).filter((s) => s.role === "maintenance");
  const clash = schedule.isError && isApiError(schedule.error) && schedule.error.status === 409;

  const set = <K extends keyof Fields>(key: K, value: Fields[K]) => {
    if (schedule.isError) schedule.reset();
    setFields((f) => ({ ...f, [key]: value }));
    setErrors({});
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    const found = checkSchedule(fields, today);
    setErrors(found);
    if (found.who) return whoRef.current?.focus();
    if (found.date) return dateRef.current?.focus();
    if (found.window) return windowRef.current?.focus();
    const slot = { date: fields.date, window: fields.window as SlotWindow };
    const body: ScheduleBody =
      fields.who === "operative"
        ? { assigneeId: Number(fields.assigneeId), slot }
        : { contractorId: Number(fields.contractorId), slot };
    schedule.mutate(body, {
      // A 409 (already booked) keeps the dialog open with the server's message.
      onSuccess: (updated) => {
        onScheduled?.(updated);
        onClose();
      },
    });
  };

  const current = order.slot;
  const currentWho = order.assignee?.name ?? (order.contractor ? `${order.contractor.name} (contractor)` : null);
  const address = order.property?.addressLine1
    ? [order.property.addressLine1, order.property.town, order.property.postcode].filter(Boolean).join(", ")
    : null;

  return (
    <form onSubmit={submit} noValidate className="flex flex-col gap-4">
      <div className="flex flex-col gap-1">
        <p>
          <span className="font-semibold">{typeName(order.type)}</span>
          {address ? ` at ${address}` : null}
        </p>
        <p className="whitespace-pre-line text-ink-soft">{order.description}</p>
        {order.targetDate ? (
          <p className="text-sm">
            To be done by <strong>{formatDate(order.targetDate)}</strong>
          </p>
        ) : null}
      </div>

      {current ? (
        <Alert tone="info" live="none" title="Booked now">
          <p>
            {formatDate(current.date)},{" "}
            {isWindow(current.window)
              ? `${windowNames[current.window].toLowerCase()}, ${windowHours[current.window]}`
              : current.window}
            {currentWho ? `, ${currentWho}` : ""}.
          </p>
          {order.booking?.response === "change-requested" || order.status === "change-requested" ? (
            <p className="mt-1">
              <strong>The tenant asked for another time</strong>
              {order.booking?.reason ? `: “${order.booking.reason}”` : "."}
            </p>
          ) : null}
        </Alert>
      ) : null}

      {isFanWork(order.type) ? <FanGuidance /> : null}

      <RadioGroup
        legend="Who will do the work"
        options={WHO_CHOICES}
        value={fields.who}
        onChange={(v) => set("who", v)}
        columns={2}
      />
      {fields.who === "operative" ? (
        staff.isPending ? (
          <LoadingState className="py-2">Loading operatives…</LoadingState>
        ) : staff.isError ? (
          <Alert tone="warning" title="We couldn't load the operatives">
            {errorMessage(staff.error)}
          </Alert>
        ) : (
          <Select
            ref={whoRef}
            label="Operative"
            value={fields.assigneeId}
            error={errors.who}
            onChange={(e) => set("assigneeId", e.target.value)}
            controlClassName="sm:max-w-md"
          >
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
        <p className="text-ink-soft">
          No contractors on record yet. A maintenance lead or administrator can add them on the Works page.
        </p>
      ) : (
        <Select
          ref={whoRef}
          label="Contractor"
          value={fields.contractorId}
          error={errors.who}
          onChange={(e) => set("contractorId", e.target.value)}
          controlClassName="sm:max-w-md"
        >
          <option value="">Choose a contractor</option>
          {contractors.data.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
              {c.trade ? ` (${c.trade})` : ""}
            </option>
          ))}
        </Select>
      )}

      <Input
        ref={dateRef}
        type="date"
        label="Day of the visit"
        min={today}
        value={fields.date}
        error={errors.date}
        onChange={(e) => set("date", e.target.value)}
        controlClassName="sm:max-w-xs"
      />
      <RadioGroup<SlotWindow>
        legend="Time of day"
        hint="UK time."
        options={WINDOW_CHOICES}
        value={fields.window}
        onChange={(v) => set("window", v)}
        error={errors.window}
        inputRef={windowRef}
        columns={3}
      />

      {schedule.isError ? (
        <Alert tone="danger" title={clash ? "That slot is already taken" : "The visit was not booked"}>
          <p>{errorMessage(schedule.error)}</p>
        </Alert>
      ) : null}

      <p className="text-sm text-ink-soft">
        The tenant gets an e-mail with the day and time (never the description above) and is asked to confirm the visit or to ask
        for another time.
      </p>

      <div className="flex flex-wrap justify-end gap-2">
        <Button variant="secondary" onClick={onClose} disabled={schedule.isPending}>
          Cancel
        </Button>
        <Button type="submit" busy={schedule.isPending}>
          Book the visit
        </Button>
      </div>
    </form>
  );
}
