import { createContext, use, useEffect, useId, useRef, useState, type ReactNode } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { useStaff, type StaffMember } from "@/lib/staff";
import { useWeekOrders } from "../api/get-work-orders";
import type { SlotWindow, WorkOrder } from "../api/types";
import { useWeekParam } from "../hooks/use-works-params";
import { labelFor, orderReference, typeLabels, windowShortLabels } from "../lib/labels";
import { addDays, formatLongDate, formatWeekday, todayInLondon, workingDays } from "../lib/week";
import { ScheduleDialog, type SlotPreset } from "./schedule-dialog";
import { SlotOrderPicker } from "./slot-order-picker";
import { TenantAnswerText } from "./tenant-answer";

const CONTRACTORS_ROW = "contractors";

interface BoardRow {
  key: string;
  name: string;
  /** The operative's user id; null for the contractors' row. */
  operativeId: number | null;
}

/** A free half-day chosen on the board, with the row's name for the dialog. */
type FreeSlot = SlotPreset & { who: string };

/** How a free half-day offers itself for booking: null where nothing can be booked (past days, weekends). */
const BookSlotContext = createContext<((slot: FreeSlot) => void) | null>(null);

/** One row per operative (maintenance staff, and anyone else booked this week), then the contractors. */
export function boardRows(staff: readonly StaffMember[] | undefined, orders: readonly WorkOrder[]): BoardRow[] {
  const people = new Map<number, string>();
  for (const person of staff ?? []) if (person.role === "maintenance") people.set(person.id, person.name);
  for (const order of orders)
    if (order.assignee && !people.has(order.assignee.id)) people.set(order.assignee.id, order.assignee.name);
  const rows: BoardRow[] = [...people.entries()]
    .sort((a, b) => a[1].localeCompare(b[1], "en-GB"))
    .map(([id, name]) => ({ key: `operative-${id}`, name, operativeId: id }));
  rows.push({ key: CONTRACTORS_ROW, name: "Contractors", operativeId: null });
  return rows;
}

const rowKeyOf = (order: WorkOrder) =>
  order.assignee ? `operative-${order.assignee.id}` : order.contractor ? CONTRACTORS_ROW : null;

function Booking({ order, showContractor }: { order: WorkOrder; showContractor: boolean }) {
  return (
    <li className="flex flex-col gap-0.5 rounded-md border border-line bg-surface px-2 py-1.5 text-sm">
      <TextLink to={`/cases/${order.caseId}`} className="whitespace-nowrap">
        {orderReference(order)}
      </TextLink>
      <span>{labelFor(typeLabels, order.type)}</span>
      <span className="text-ink-soft">{order.property.addressLine1}</span>
      {showContractor && order.contractor ? <span className="font-semibold">{order.contractor.name}</span> : null}
      <TenantAnswerText order={order} withPrefix />
    </li>
  );
}

function Half({
  window,
  orders,
  showContractor,
  spanning = false,
  free,
}: {
  window: SlotWindow;
  orders: WorkOrder[];
  showContractor: boolean;
  spanning?: boolean;
  /** This half-day, when it can be booked. */
  free?: FreeSlot;
}) {
  const labelId = useId();
  const book = use(BookSlotContext);
  return (
    <div
      role="group"
      aria-labelledby={labelId}
      className={cn("flex flex-col gap-1 rounded-md px-1.5 py-1", spanning ? "min-h-40 bg-dew-100" : "min-h-20 bg-dew-50")}
    >
      <p id={labelId} className="text-xs font-bold tracking-wide text-ink uppercase">
        {windowShortLabels[window]}
      </p>
      {orders.length ? (
        <ul className="flex flex-col gap-1">
          {orders.map((order) => (
            <Booking key={order.id} order={order} showContractor={showContractor} />
          ))}
        </ul>
      ) : free && book ? (
        <button
          type="button"
          onClick={() => book(free)}
          className="rounded-md border border-dashed border-line-strong bg-surface px-2 py-1.5 text-left text-sm font-semibold text-dew-800 hover:bg-dew-100 focus-visible:outline-2 focus-visible:outline-offset-2 focus-visible:outline-dew-700"
        >
          Free<span className="font-normal">: book</span>
          <span className="sr-only">
            {" "}
            {free.who}, {formatWeekday(free.date)}, {windowShortLabels[window]}
          </span>
        </button>
      ) : (
        <p className="text-sm text-ink-soft">Free</p>
      )}
    </div>
  );
}

/** A day for one row: the morning and the afternoon; an all-day booking spans both. */
function DayCell({
  orders,
  showContractor,
  slotOf,
}: {
  orders: WorkOrder[];
  showContractor: boolean;
  /** The free half-day to offer, when this day can be booked. */
  slotOf?: (window: SlotWindow) => FreeSlot;
}) {
  const allDay = orders.filter((o) => o.slot?.window === "all-day");
  const am = orders.filter((o) => o.slot?.window === "am");
  const pm = orders.filter((o) => o.slot?.window === "pm");
  const onlyAllDay = allDay.length > 0 && am.length === 0 && pm.length === 0;
  return (
    <td className="min-w-44 border border-line p-1.5 align-top">
      <div className="flex flex-col gap-1">
        {allDay.length ? <Half window="all-day" orders={allDay} showContractor={showContractor} spanning={onlyAllDay} /> : null}
        {onlyAllDay ? null : (
          <>
            <Half window="am" orders={am} showContractor={showContractor} free={allDay.length ? undefined : slotOf?.("am")} />
            <Half window="pm" orders={pm} showContractor={showContractor} free={allDay.length ? undefined : slotOf?.("pm")} />
          </>
        )}
      </div>
    </td>
  );
}

/**
 * The maintenance lead's week: one row per operative (and one for contractors), one column per
 * working day, each day split into morning and afternoon. The week is in the URL (?week=). A free
 * half-day from today on is a button: it books that slot (choose the order, then the schedule
 * dialog opens with who, the day and the time filled in).
 */
export function WeekBoard() {
  const week = useWeekParam();
  const orders = useWeekOrders(week.range);
  const staff = useStaff();
  const today = todayInLondon();
  const items = orders.data?.items ?? [];
  // Monday to Friday; a Saturday or Sunday too when it holds work (booked before weekends were refused).
  const weekend = [addDays(week.monday, 5), addDays(week.monday, 6)];
  const days = [...workingDays(week.monday), ...weekend.filter((d) => items.some((o) => o.slot?.date === d))];
  const [freeSlot, setFreeSlot] = useState<FreeSlot | null>(null);
  const [booking, setBooking] = useState<{ order: WorkOrder; preset: SlotPreset } | null>(null);
  const [booked, setBooked] = useState<WorkOrder | null>(null);
  // The booking dialogs close onto a free slot that is no longer free (their opener is gone), which left
  // keyboard focus at the page's start: it goes to the notice saying what was booked (WCAG 2.4.3).
  const bookedRef = useRef<HTMLDivElement>(null);
  const justBooked = useRef(false);
  useEffect(() => {
    if (!justBooked.current || !booked || booking) return;
    justBooked.current = false;
    bookedRef.current?.focus();
  }, [booked, booking]);
  const rows = boardRows(staff.data, items);
  const caption = `Bookings for the week of ${formatLongDate(week.monday)}`;

  const byCell = new Map<string, WorkOrder[]>();
  for (const order of items) {
    const row = rowKeyOf(order);
    if (!row || !order.slot) continue;
    const key = `${row}|${order.slot.date}`;
    byCell.set(key, [...(byCell.get(key) ?? []), order]);
  }

  let body: ReactNode;
  if (orders.isPending || staff.isPending) {
    body = <LoadingState>Loading the week…</LoadingState>;
  } else if (orders.isError) {
    body = (
      <Alert tone="danger" title="We could not load this week's bookings">
        <p>{errorMessage(orders.error)}</p>
        <Button size="sm" variant="secondary" className="mt-2" onClick={() => void orders.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  } else {
    body = (
      <>
        {items.length === 0 ? (
          <EmptyState title="No work booked this week" className="py-5">
            Choose a free slot below to book an order into it, book one from the table, or look at another week.
          </EmptyState>
        ) : null}
        {orders.data.total > items.length ? (
          <Alert tone="warning">
            Only the first {items.length} of {orders.data.total} bookings this week are shown.
          </Alert>
        ) : null}
        {staff.isError ? (
          <Alert tone="warning">We could not load the list of operatives; only those booked this week are shown.</Alert>
        ) : null}
        <div
          role="region"
          aria-label={`${caption} (scrolls sideways)`}
          tabIndex={0}
          className="overflow-x-auto rounded-md border border-line bg-surface"
        >
          <table className="w-full border-collapse text-left text-sm" aria-busy={orders.isFetching || undefined}>
            <caption className="px-3 pt-3 pb-2 text-left font-bold">{caption}</caption>
            <thead className="bg-dew-50">
              <tr>
                <th scope="col" className="border border-line px-3 py-2 font-bold">
                  Operative
                </th>
                {days.map((day) => (
                  <th key={day} scope="col" className="border border-line px-3 py-2 font-bold whitespace-nowrap">
                    <time dateTime={day}>{formatWeekday(day)}</time>
                    {day === today ? <span className="ml-1 font-normal">(today)</span> : null}
                  </th>
                ))}
              </tr>
            </thead>
            <tbody>
              {rows.map((row) => (
                <tr key={row.key}>
                  <th scope="row" className="border border-line bg-paper px-3 py-2 align-top font-bold whitespace-nowrap">
                    {row.name}
                  </th>
                  {days.map((day) => (
                    <DayCell
                      key={day}
                      orders={byCell.get(`${row.key}|${day}`) ?? []}
                      showContractor={row.key === CONTRACTORS_ROW}
                      slotOf={
                        day >= today && !weekend.includes(day)
                          ? (window) => ({ assigneeId: row.operativeId, date: day, window, who: row.name })
                          : undefined
                      }
                    />
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </>
    );
  }

  return (
    <BookSlotContext
      value={(slot) => {
        setBooked(null);
        setFreeSlot(slot);
      }}
    >
      <div className="flex flex-col gap-3">
        <nav aria-label="Choose the week" className="flex flex-wrap items-center gap-2">
          <Button size="sm" variant="secondary" onClick={week.previous}>
            <span aria-hidden="true">‹</span> Previous week
          </Button>
          <Button size="sm" variant="secondary" onClick={week.thisWeek} disabled={week.isThisWeek}>
            This week
          </Button>
          <Button size="sm" variant="secondary" onClick={week.next}>
            Next week <span aria-hidden="true">›</span>
          </Button>
          <p aria-live="polite" className="ml-1 font-semibold">
            Week of {formatLongDate(week.monday)}
          </p>
        </nav>
        {booked ? (
          <div ref={bookedRef} tabIndex={-1}>
            <Alert tone="success" title={`${orderReference(booked)} is booked`}>
              The tenant gets an e-mail with the day and time and is asked to confirm it.
            </Alert>
          </div>
        ) : null}
        {body}
        <SlotOrderPicker
          slot={freeSlot}
          onClose={() => setFreeSlot(null)}
          onPick={(order) => {
            const preset = freeSlot;
            setFreeSlot(null);
            if (preset) setBooking({ order, preset });
          }}
        />
        <ScheduleDialog
          order={booking?.order ?? null}
          preset={booking?.preset}
          onClose={() => setBooking(null)}
          onScheduled={(order) => {
            justBooked.current = true;
            setBooked(order);
          }}
        />
      </div>
    </BookSlotContext>
  );
}
