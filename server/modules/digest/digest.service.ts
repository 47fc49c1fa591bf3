// The officers' morning e-mail: every open case whose next deadline has passed or falls due
// within the next two working days (Europe/London, England-and-Wales bank holidays).
//
// Rules (ours):
// - Who: every active officer of every landlord. Each gets the open cases assigned to them plus
//   the landlord's unassigned ones (nobody else will chase those). Officers with nothing due get
//   no e-mail.
// - Window: next_due_at at or before the end of the second working day after today (today is
//   day 0, as in working-days.ts), overdue cases included. An emergency hazard past its deadline
//   first (as in the queue, src/lib/domain/triage-priority.ts), then the other overdue cases, then
//   by due time.
// - When: on working days only. At most one digest per officer per London calendar day: the
//   `deadline_digests` row, unique on (user, day), is written in the same transaction as the outbox
//   e-mail, and the e-mail is sent after the commit. A crash before the commit leaves nothing (the
//   next run sends it); after the commit the day counts as done (the outbox row shows whether the
//   send worked). Two runs at once: the second insert hits the unique key and rolls its e-mail back.
import { In, type DataSource } from "typeorm";
import type { DeadlineStage } from "../../../src/lib/domain/deadlines.js";
import {
  addWorkingDays,
  endOfLocalDay,
  isWorkingDay,
  localDate,
  LONDON_TIME_ZONE,
} from "../../../src/lib/domain/working-days.js";
import type { Config } from "../../config/env.js";
import type { Logger } from "../../lib/logger.js";
import type { Case, CaseService } from "../cases/case.service.js";
import { addressOf } from "../cases/case.service.js";
import type { MailService } from "../mail/mail.service.js";
import type { Person, UserService } from "../users/user.service.js";
import { DeadlineDigest } from "./deadline-digest.entity.js";

/** How many working days ahead the digest looks (after today). */
export const DIGEST_WORKING_DAYS = 2;

/** What each deadline stage asks of the landlord, in plain words. */
export const STAGE_WORDS: Record<DeadlineStage, string> = {
  "make-safe": "Make the home safe (emergency hazard)",
  investigate: "Investigate the hazard",
  summary: "Send the tenant the written summary of the investigation",
  "safety-work": "Begin the work to make the home safe",
  "supplementary-work": "Begin the further work that stops it coming back",
};

export interface DigestRun {
  /** The London calendar day of the run. */
  date: string;
  /** false on a weekend or bank holiday: nothing is sent. */
  workingDay: boolean;
  /** Digests sent (queued and handed to the mailer) by this run. */
  sent: number;
  /** Officers with cases due who already had today's digest. */
  alreadySent: number;
  /** Officers whose digest could not be recorded (logged; the next run tries again). */
  failed: number;
}

const dayParts = new Intl.DateTimeFormat("en-GB", {
  timeZone: LONDON_TIME_ZONE,
  weekday: "long",
  day: "numeric",
  month: "long",
  year: "numeric",
});
const timeParts = new Intl.DateTimeFormat("en-GB", {
  timeZone: LONDON_TIME_ZONE,
  hour: "2-digit",
  minute: "2-digit",
  hourCycle: "h23",
});
const part = (parts: Intl.DateTimeFormatPart[], type: Intl.DateTimeFormatPartTypes) =>
  parts.find((p) => p.type === type)?.value ?? "";

/** "Tuesday 3 December 2024": the London day of `instant` (built from parts, whatever the ICU version's punctuation). */
export function londonDayInWords(instant: Date): string {
  const p = dayParts.formatToParts(instant);
  return `${part(p, "weekday")} ${part(p, "day")} ${part(p, "month")} ${part(p, "year")}`;
}

/** "14:30", London time. */
function londonTime(instant: Date): string {
  const p = timeParts.formatToParts(instant);
  return `${part(p, "hour")}:${part(p, "minute")}`;
}

/** "by the end of Thursday 5 December 2024 (23:59)" for an end-of-day deadline, else "Thursday 5 December 2024 at 14:30" (UK time). */
export function dueInWords(due: Date): string {
  const day = londonDayInWords(due);
  if (endOfLocalDay(localDate(due)).getTime() === due.getTime()) return `by the end of ${day} (${londonTime(due)})`;
  return `${day} at ${londonTime(due)}`;
}

const isDuplicateKey = (error: unknown): boolean => {
  const e = error as { code?: unknown; errno?: unknown; driverError?: { code?: unknown; errno?: unknown } } | null;
  return (
    e?.code === "ER_DUP_ENTRY" || e?.errno === 1062 || e?.driverError?.code === "ER_DUP_ENTRY" || e?.driverError?.errno === 1062
  );
};

export class DigestService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly config: Config,
    private readonly mail: MailService,
    private readonly logger: Logger,
    private readonly cases: CaseService,
    private readonly users: UserService,
  ) {}

  /** Sends today's digests (London day of `now`) to every officer who has not had one yet. */
  async sendDue(now: Date): Promise<DigestRun> {
    const date = localDate(now);
    const run: DigestRun = { date, workingDay: isWorkingDay(date), sent: 0, alreadySent: 0, failed: 0 };
    if (!run.workingDay) return run;
    const windowEnd = addWorkingDays(now, DIGEST_WORKING_DAYS);

    // Every landlord at once: open cases with a deadline at or before the end of the window.
    const due = await this.cases.openDueBy(windowEnd);
    if (due.length === 0) return run;

    const byOrganisation = new Map<number, Case[]>();
    for (const c of due) {
      const list = byOrganisation.get(c.organisationId);
      if (list) list.push(c);
      else byOrganisation.set(c.organisationId, [c]);
    }
    const officers = await this.users.activeOfficersOf([...byOrganisation.keys()]);
    if (officers.length === 0) return run;
    const done = new Set(
      (
        await this.dataSource
          .getRepository(DeadlineDigest)
          .find({ select: { userId: true }, where: { digestDate: date, userId: In(officers.map((o) => o.id)) } })
      ).map((d) => d.userId),
    );

    for (const officer of officers) {
      const cases = (byOrganisation.get(officer.organisationId) ?? []).filter(
        (c) => c.assigneeUserId === null || c.assigneeUserId === officer.id,
      );
      if (cases.length === 0) continue;
      if (done.has(officer.id)) {
        run.alreadySent += 1;
        continue;
      }
      try {
        const outcome = await this.sendOne(officer, cases, { now, date, windowEnd });
        if (outcome === "sent") run.sent += 1;
        else run.alreadySent += 1;
      } catch (error) {
        run.failed += 1;
        this.logger.error(
          { err: error instanceof Error ? error.message : String(error), userId: officer.id, date },
          "deadline digest could not be recorded",
        );
      }
    }
    return run;
  }

  private async sendOne(
    officer: Person,
    cases: Case[],
    at: { now: Date; date: string; windowEnd: Date },
  ): Promise<"sent" | "already-sent"> {
    const nowMs = at.now.getTime();
    const items = cases
      .map((c) => ({ c, overdue: c.nextDueAt!.getTime() < nowMs }))
      .map((item) => ({ ...item, emergency: item.overdue && item.c.hazardClass === "emergency" }))
      .sort(
        (a, b) =>
          Number(b.emergency) - Number(a.emergency) ||
          Number(b.overdue) - Number(a.overdue) ||
          a.c.nextDueAt!.getTime() - b.c.nextDueAt!.getTime() ||
          a.c.id - b.c.id,
      )
      .map(({ c, overdue }) => ({
        reference: c.reference ?? `Case ${c.id}`,
        address: addressOf(c.property!),
        stage: c.nextStage ? (STAGE_WORDS[c.nextStage] ?? c.nextStage) : "Next deadline",
        due: dueInWords(c.nextDueAt!),
        overdue,
        assignedToYou: c.assigneeUserId === officer.id,
        link: `${this.config.appUrl}/cases/${c.id}`,
      }));

    let deliver: () => Promise<unknown>;
    try {
      deliver = await this.dataSource.transaction(async (m) => {
        const queued = await this.mail.enqueueWithId(m, {
          to: officer.email,
          template: "deadlineDigest",
          organisationId: officer.organisationId,
          related: { type: "user", id: officer.id },
          data: {
            name: officer.name,
            date: londonDayInWords(at.now),
            windowEnd: `the end of ${londonDayInWords(at.windowEnd)}`,
            items,
            // The queue filters by calendar days (dueWithin=2); over a weekend it shows a little less than the digest.
            queueLink: `${this.config.appUrl}/queue?dueWithin=2`,
          },
        });
        await m.getRepository(DeadlineDigest).insert({ userId: officer.id, digestDate: at.date, outboxEmailId: queued.outboxId });
        return queued.deliver;
      });
    } catch (error) {
      // Another run recorded this officer's digest first; its e-mail is the one that goes.
      if (isDuplicateKey(error)) return "already-sent";
      throw error;
    }
    await deliver();
    return "sent";
  }
}
