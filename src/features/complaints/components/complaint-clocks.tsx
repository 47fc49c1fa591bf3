import type { ComplaintResponse, ComplaintStageResponse } from "@/lib/contracts";
import { formatLongDay, formatWeekdayDateTimeZoned } from "@/lib/dates";
import { CLOCK_STATE_LABELS } from "../lib/labels";

const tone: Record<string, string> = {
  pending: "border-dew-700 bg-dew-50 text-dew-800",
  met: "border-moss-600 bg-moss-50 text-moss-700",
  missed: "border-rust-600 bg-rust-50 text-rust-700",
  "not-started": "border-line-strong bg-paper text-ink-soft",
};
// A shape as well as a colour, so the state never rests on colour alone.
const mark: Record<string, string> = { pending: "○", met: "✓", missed: "!", "not-started": "–" };

function ClockTag({ state }: { state: string }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded-pill border px-2 py-0.5 text-sm font-semibold ${tone[state] ?? ""}`}>
      <span aria-hidden="true">{mark[state]}</span>
      {CLOCK_STATE_LABELS[state] ?? state}
    </span>
  );
}

function when(at: string | null, staff: boolean) {
  if (!at) return "Not yet";
  return <time dateTime={at}>{staff ? formatWeekdayDateTimeZoned(at) : formatLongDay(at)}</time>;
}

function Stage({ s, staff }: { s: ComplaintStageResponse; staff: boolean }) {
  return (
    <li className="flex flex-col gap-1 py-2">
      <span className="font-semibold">Stage {s.stage}</span>
      <dl className="grid grid-cols-[auto_auto_1fr] items-center gap-x-3 gap-y-1 text-sm">
        <dt className="text-ink-soft">Acknowledge by</dt>
        <dd>{s.acknowledgeDueAt ? when(s.acknowledgeDueAt, staff) : "—"}</dd>
        <dd>
          <ClockTag state={s.acknowledge} />
        </dd>
        <dt className="text-ink-soft">Respond by</dt>
        <dd>{s.respondDueAt ? when(s.respondDueAt, staff) : "—"}</dd>
        <dd>
          <ClockTag state={s.respond} />
        </dd>
      </dl>
      {s.extensionWorkingDays !== null ? (
        <p className="text-sm">
          Extended by {s.extensionWorkingDays} working {s.extensionWorkingDays === 1 ? "day" : "days"}
          {s.extensionReason ? `: ${s.extensionReason}` : "."}
        </p>
      ) : null}
    </li>
  );
}

/**
 * Each started stage's two clocks: when the acknowledgement and the response are due, and whether
 * they were in time. Staff see the time (UK), the tenant the day.
 */
export function ComplaintClocks({ complaint, staff }: { complaint: ComplaintResponse; staff: boolean }) {
  const started = complaint.stages.filter((s) => s.startedAt !== null);
  return (
    <ul className="flex flex-col divide-y divide-line" aria-label="Complaint clocks">
      {started.map((s) => (
        <Stage key={s.stage} s={s} staff={staff} />
      ))}
    </ul>
  );
}
