import { useId, useState, type ComponentType } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { ScheduleDialog } from "./schedule-dialog";
import { errorMessage } from "@/lib/api-client";
import { useCaseWorkOrders } from "../api/get-case-work-orders";
import type { BookingHistoryItem, WorkOrder, WorkPhoto } from "../api/case-types";
import { longDate, minutesInWords, priorityLabel, slotForStaff, workStatusLabel, workTypeLabel } from "../lib/words";
import { formatDateTimeZoned } from "@/lib/dates";
import { BookingAnswerView } from "./booking-answer";
import { CancelDialog } from "./cancel-dialog";
import { CompletionDialog } from "./completion-dialog";

export interface WorkOrderListProps {
  caseId: number;
  /** Maintenance leads and administrators book, complete and cancel. */
  canManage: boolean;
  /** The case's photos (read by the page, under the case's photos key); an order shows those taken after its works. undefined while loading. */
  photos: readonly WorkPhoto[] | undefined;
  /** The app's photo gallery (thumbnails that open full size), supplied by the page. */
  Gallery: ComponentType<{ photos: WorkPhoto[]; emptyText: string }>;
  /** The app's photo picker and upload for one work order, supplied by the page. */
  PhotoUpload?: ComponentType<{ caseId: number; workOrderId: number }>;
}

const RANK: Record<string, number> = { "change-requested": 0, unscheduled: 1, scheduled: 2, confirmed: 3, done: 4, cancelled: 5 };

/** Open orders first (those that need a new appointment at the top), then done, then cancelled. */
const ordered = (list: readonly WorkOrder[]) =>
  [...list].sort(
    (a, b) => (RANK[a.status] ?? 9) - (RANK[b.status] ?? 9) || Date.parse(b.createdAt) - Date.parse(a.createdAt) || b.id - a.id,
  );

/** The photos of one work order, oldest first. */
const photosOfOrder = (photos: readonly WorkPhoto[], workOrderId: number) => photos.filter((p) => p.workOrderId === workOrderId);

/** Every work order of the case, with who, when, the tenant's answer and what was done. */
export function WorkOrderList({ caseId, canManage, photos, Gallery, PhotoUpload }: WorkOrderListProps) {
  const orders = useCaseWorkOrders(caseId);
  if (orders.isPending) return <LoadingState className="py-4">Loading the work orders…</LoadingState>;
  if (orders.isError)
    return (
      <Alert tone="warning" title="We couldn't load the work orders">
        {errorMessage(orders.error)}
      </Alert>
    );
  if (orders.data.length === 0)
    return <EmptyState title="No work orders yet">Once the case is investigated, add the work it needs.</EmptyState>;
  return (
    <ol className="flex flex-col gap-4">
      {ordered(orders.data).map((o) => (
        <WorkOrderItem
          key={o.id}
          order={o}
          canManage={canManage}
          photos={photos ? photosOfOrder(photos, o.id) : null}
          Gallery={Gallery}
          PhotoUpload={PhotoUpload}
        />
      ))}
    </ol>
  );
}

/** What staff read once a visit is booked: who, when, and that the tenant is asked. */
const bookedMessage = (o: WorkOrder) => {
  const who = o.assignee?.name ?? o.contractor?.name ?? "the visit";
  return o.slot
    ? `Booked ${who} for ${slotForStaff(o.slot)}. The tenant has been asked to confirm.`
    : "The visit is booked. The tenant has been asked to confirm.";
};

type Open = "schedule" | "complete" | "cancel" | null;

interface ItemProps extends Omit<WorkOrderListProps, "caseId" | "photos"> {
  order: WorkOrder;
  photos: WorkPhoto[] | null;
}

function WorkOrderItem({ order: o, canManage, photos, Gallery, PhotoUpload }: ItemProps) {
  const headingId = useId();
  const [open, setOpen] = useState<Open>(null);
  const [done, setDone] = useState<string | null>(null);
  const closed = o.status === "done" || o.status === "cancelled";
  const who = o.assignee ? o.assignee.name : o.contractor ? `${o.contractor.name} (contractor)` : null;
  const finish = (message: string) => {
    setOpen(null);
    setDone(message);
  };
  const history = (o.bookings ?? []).filter((b) => b.state !== "active");

  return (
    <li aria-labelledby={headingId} className="flex flex-col gap-3 rounded-md border border-line bg-paper p-3 sm:p-4">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h4 id={headingId} className="text-lg font-bold">
          {workTypeLabel(o.type)}
        </h4>
        <span className="text-sm font-semibold">{workStatusLabel(o.status)}</span>
      </div>
      <p className="whitespace-pre-line">{o.description}</p>
      <dl className="grid grid-cols-1 gap-x-4 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        <dt className="font-semibold">Rooms</dt>
        <dd>{o.rooms.length ? o.rooms.map((r) => r.name).join(", ") : "Not given"}</dd>
        <dt className="font-semibold">Priority</dt>
        <dd>{priorityLabel(o.priority)}</dd>
        <dt className="font-semibold">Target date</dt>
        <dd>{o.targetDate ? longDate(o.targetDate) : "None set"}</dd>
        <dt className="font-semibold">Done by</dt>
        <dd>{who ?? "Nobody booked yet"}</dd>
        <dt className="font-semibold">Appointment</dt>
        <dd>{o.slot ? slotForStaff(o.slot) : "Not booked yet"}</dd>
        {o.status !== "cancelled" && o.status !== "done" ? (
          <>
            <dt className="font-semibold">Tenant's answer</dt>
            <dd>
              <BookingAnswerView order={o} />
            </dd>
          </>
        ) : null}
        {o.accessNotes ? (
          <>
            <dt className="font-semibold">For the operative</dt>
            <dd className="whitespace-pre-line">{o.accessNotes}</dd>
          </>
        ) : null}
      </dl>
      {history.length ? <BookingHistory items={history} /> : null}
      {o.completion ? (
        <section aria-label="What was done" className="flex flex-col gap-1 rounded-md border border-line bg-surface p-3 text-sm">
          <p className="font-bold">
            Done on {formatDateTimeZoned(o.completion.at)} by {o.completion.by}
          </p>
          <p className="whitespace-pre-line">{o.completion.note}</p>
          <dl className="grid grid-cols-1 gap-x-4 gap-y-1 sm:grid-cols-[auto_1fr]">
            {o.completion.materials ? (
              <>
                <dt className="font-semibold">Materials</dt>
                <dd className="whitespace-pre-line">{o.completion.materials}</dd>
              </>
            ) : null}
            {o.completion.minutesOnSite !== null ? (
              <>
                <dt className="font-semibold">Time on site</dt>
                <dd>{minutesInWords(o.completion.minutesOnSite)}</dd>
              </>
            ) : null}
            {o.completion.followOn ? (
              <>
                <dt className="font-semibold">Follow-on work found</dt>
                <dd className="whitespace-pre-line">{o.completion.followOn}</dd>
              </>
            ) : null}
          </dl>
        </section>
      ) : null}
      {o.status === "done" ? (
        <section aria-label="Photos after the works" className="flex flex-col gap-2">
          <p className="font-semibold">Photos after the works</p>
          {photos === null ? (
            <LoadingState className="py-2">Loading photos…</LoadingState>
          ) : (
            <Gallery photos={photos} emptyText="No after-photos yet" />
          )}
          {canManage && PhotoUpload ? <PhotoUpload caseId={o.caseId} workOrderId={o.id} /> : null}
        </section>
      ) : null}
      {done ? <Alert tone="success">{done}</Alert> : null}
      {canManage && !closed ? (
        <div className="flex flex-wrap gap-2">
          <Button
            variant={o.status === "unscheduled" || o.status === "change-requested" ? "primary" : "secondary"}
            onClick={() => {
              setDone(null);
              setOpen("schedule");
            }}
          >
            {o.slot ? "Reschedule…" : "Schedule…"}
            <span className="sr-only"> {workTypeLabel(o.type)}</span>
          </Button>
          {o.slot ? (
            <Button
              variant="secondary"
              onClick={() => {
                setDone(null);
                setOpen("complete");
              }}
            >
              Record completion…<span className="sr-only"> {workTypeLabel(o.type)}</span>
            </Button>
          ) : null}
          <Button
            variant="ghost"
            onClick={() => {
              setDone(null);
              setOpen("cancel");
            }}
          >
            Cancel order<span className="sr-only"> {workTypeLabel(o.type)}</span>
          </Button>
        </div>
      ) : null}
      <ScheduleDialog
        order={open === "schedule" ? o : null}
        onClose={() => setOpen(null)}
        onScheduled={(booked) => finish(bookedMessage(booked))}
      />
      <CompletionDialog order={o} open={open === "complete"} onClose={() => setOpen(null)} onDone={finish} />
      <CancelDialog order={o} open={open === "cancel"} onClose={() => setOpen(null)} onDone={finish} />
    </li>
  );
}

const BOOKING_STATE: Record<string, string> = {
  replaced: "Replaced by a later booking",
  cancelled: "Cancelled",
  active: "Current",
};

function BookingHistory({ items }: { items: BookingHistoryItem[] }) {
  return (
    <details className="text-sm">
      <summary className="cursor-pointer font-semibold text-dew-700">Earlier bookings ({items.length})</summary>
      <ul className="mt-2 flex flex-col gap-1">
        {[...items]
          .sort((a, b) => Date.parse(b.createdAt) - Date.parse(a.createdAt))
          .map((b) => (
            <li key={b.id}>
              {slotForStaff(b)}
              {b.assignee ? `, ${b.assignee.name}` : b.contractor ? `, ${b.contractor.name} (contractor)` : ""} ·{" "}
              {BOOKING_STATE[b.state] ?? b.state}
              {b.response === "change-requested" ? (
                <span className="text-ink-soft"> · tenant asked for another time{b.reason ? `: “${b.reason}”` : ""}</span>
              ) : null}
              {b.response === "confirmed" ? <span className="text-ink-soft"> · tenant had confirmed</span> : null}
              <span className="text-ink-soft"> · booked {formatDateTimeZoned(b.createdAt)}</span>
            </li>
          ))}
      </ul>
    </details>
  );
}
