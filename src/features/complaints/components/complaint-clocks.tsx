import type { ComplaintResponse, ComplaintStageResponse } from "@/lib/contracts";
import { formatWeekdayDateTimeZoned } from "@/lib/dates";
import { englishComplaintWords, type ComplaintWords } from "../lib/words";

const tone: Record<string, string> = {
  pending: "border-dew-700 bg-dew-50 text-dew-800",
  met: "border-moss-600 bg-moss-50 text-moss-700",
  missed: "border-rust-600 bg-rust-50 text-rust-700",
  "not-started": "border-line-strong bg-paper text-ink-soft",
};
// A shape as well as a colour, so the state never rests on colour alone.
const mark: Record<string, string> = { pending: "○", met: "✓", missed: "!", "not-started": "–" };

function ClockTag({ state, words }: { state: string; words: ComplaintWords }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded-pill border px-2 py-0.5 text-sm font-semibold ${tone[state] ?? ""}`}>
      <span aria-hidden="true">{mark[state]}</span>
      {words.clockState(state)}
    </span>
  );
}

function when(at: string | null, staff: boolean, words: ComplaintWords) {
  if (!at) return words.notYet;
  return <time dateTime={at}>{staff ? formatWeekdayDateTimeZoned(at) : words.day(at)}</time>;
}

function Stage({ s, staff, words }: { s: ComplaintStageResponse; staff: boolean; words: ComplaintWords }) {
  return (
    <li className="flex flex-col gap-1 py-2">
      <span className="font-semibold">{words.stage(s.stage)}</span>
      <dl className="grid grid-cols-[auto_auto_1fr] items-center gap-x-3 gap-y-1 text-sm">
        <dt className="text-ink-soft">{words.acknowledgeBy}</dt>
        <dd>{s.acknowledgeDueAt ? when(s.acknowledgeDueAt, staff, words) : "—"}</dd>
        <dd>
          <ClockTag state={s.acknowledge} words={words} />
        </dd>
        <dt className="text-ink-soft">{words.respondBy}</dt>
        <dd>{s.respondDueAt ? when(s.respondDueAt, staff, words) : "—"}</dd>
        <dd>
          <ClockTag state={s.respond} words={words} />
        </dd>
      </dl>
      {s.extensionWorkingDays !== null ? (
        <p className="text-sm">{words.extended(s.extensionWorkingDays, s.extensionReason)}</p>
      ) : null}
    </li>
  );
}

/**
 * Each started stage's two clocks: when the acknowledgement and the response are due, and whether
 * they were in time. Staff see the time (UK), the tenant the day (in their language: `words`).
 */
export function ComplaintClocks({
  complaint,
  staff,
  words = englishComplaintWords,
}: {
  complaint: ComplaintResponse;
  staff: boolean;
  words?: ComplaintWords;
}) {
  const started = complaint.stages.filter((s) => s.startedAt !== null);
  return (
    <ul className="flex flex-col divide-y divide-line" aria-label={words.clocksLabel}>
      {started.map((s) => (
        <Stage key={s.stage} s={s} staff={staff} words={words} />
      ))}
    </ul>
  );
}
