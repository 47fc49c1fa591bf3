// The monthly board report: one PDF of a landlord's damp and mould figures for a calendar month (London
// time), made on the server with the same figures as the dashboard (InsightService), the Category 1
// hazards open as it is made, and the deadlines missed in the month. Downloaded by staff, and e-mailed
// to the list the admin keeps (BoardReportRecipients), once a month by the scheduler or at once by an admin.
import { PassThrough, type Writable } from "node:stream";
import type { DataSource } from "typeorm";
import { z } from "zod";
import { durationLabels, hotspotDimensionLabels, hotspotValueLabel, stageLabel } from "../../../src/lib/contracts/insight.js";
import { formatDay, formatDayTimeZoned } from "../../../src/lib/dates.js";
import { staffStatusLabel } from "../../../src/lib/labels.js";
import { localDate } from "../../../src/lib/domain/working-days.js";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { ForbiddenError, ValidationError } from "../../lib/errors.js";
import { inTransaction } from "../../lib/transaction.js";
import type { Logger } from "../../lib/logger.js";
import { PdfWriter } from "../../lib/pdf/pdf-document.js";
import type { MailService } from "../mail/mail.service.js";
import type { OrganisationService } from "../organisations/organisation.service.js";
import type { InsightService } from "../insight/insight.service.js";
import type { InspectionService } from "../inspections/inspection.service.js";
import { BoardReportSend, BoardReportSettings } from "./board-report.entity.js";

/** A calendar month, written YYYY-MM. */
export const monthSchema = z
  .string()
  .regex(/^\d{4}-(0[1-9]|1[0-2])$/, "month must be written YYYY-MM, e.g. 2026-11.")
  .refine((m) => Number(m.slice(0, 4)) >= 2000, "month must be 2000 or later.");

/** The most addresses one landlord's board report goes to. */
export const MAX_RECIPIENTS = 30;
const recipientSchema = z.string().trim().toLowerCase().email("is not an e-mail address.").max(190);

export const PDF_MEDIA_TYPE = "application/pdf";

const monthName = new Intl.DateTimeFormat("en-GB", { month: "long", year: "numeric", timeZone: "UTC" });
/** "November 2026". */
export const monthWords = (month: string) => monthName.format(new Date(`${month}-01T00:00:00Z`));
const lastDay = (month: string) => {
  const [y, m] = month.split("-").map(Number) as [number, number];
  return new Date(Date.UTC(y, m, 0)).toISOString().slice(0, 10);
};
/** The month before the London month that `now` is in. */
export function previousMonth(now: Date): string {
  const [y, m] = localDate(now).split("-").map(Number) as [number, number];
  return new Date(Date.UTC(y, m - 2, 1)).toISOString().slice(0, 7);
}
const pct = (v: number | null) => (v === null ? "–" : `${v.toFixed(0)} %`);
const pounds = (pence: number) => `£${(pence / 100).toFixed(2)}`;
const days = (v: number | null) => (v === null ? "–" : v.toFixed(1).replace(/\.0$/, ""));

export interface PreparedBoardReport {
  fileName: string;
  /** Writes the PDF to `out` and ends it. */
  write(out: Writable): Promise<void>;
}

export class BoardReportService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly insight: InsightService,
    private readonly organisations: OrganisationService,
    private readonly mail: MailService,
    private readonly inspections: Pick<InspectionService, "missedReasons">,
    private readonly clock: Clock,
    private readonly logger?: Logger,
  ) {}

  /** The report of `month` for the actor's landlord; every figure is read before the first byte is written. */
  async prepare(actor: Actor, month: string): Promise<PreparedBoardReport> {
    const m = monthSchema.safeParse(month);
    if (!m.success)
      throw new ValidationError(`month: ${m.error.issues[0]!.message}`, [
        { field: "month", message: m.error.issues[0]!.message },
      ]);
    const now = this.clock.now();
    const from = `${month}-01`;
    const to = lastDay(month);
    if (from > localDate(now))
      throw new ValidationError("month: that month has not begun yet.", [{ field: "month", message: "has not begun yet." }]);
    const org = actor.organisationId;
    // The dashboard first: it brings the cases' stored figures (category, clocks) up to date, which the lists read.
    const dashboard = await this.insight.dashboard(actor, { from, to });
    const [name, rolling, categoryOne, missed] = await Promise.all([
      this.organisations.nameOf(org),
      this.insight.dashboard(actor, { to }),
      this.insight.openCategoryOne(org),
      // UTC bounds a day wider than the London month; the list is cut to the London month below.
      this.insight.missedDeadlines(
        org,
        new Date(Date.parse(`${from}T00:00:00Z`) - 86_400_000),
        new Date(Date.parse(`${to}T00:00:00Z`) + 2 * 86_400_000),
      ),
    ]);
    const inMonth = missed.filter((d) => localDate(d.dueAt).startsWith(month));
    const reasons = await this.inspections.missedReasons([...new Set(inMonth.map((d) => d.caseId))]);
    const reasonOf = (d: (typeof inMonth)[number]) =>
      reasons.find((r) => r.caseId === d.caseId && r.stage === d.stage)?.reason ?? "No reason recorded";
    const title = `Damp and mould: board report, ${monthWords(month)}`;
    const made = formatDayTimeZoned(now.toISOString());
    return {
      fileName: `board-report-${month}.pdf`,
      write: async (out) => {
        const pdf = new PdfWriter({ title, organisationName: name, createdAt: now });
        const done = new Promise<void>((resolve, reject) => {
          out.on("finish", resolve);
          out.on("close", resolve);
          out.on("error", reject);
          pdf.stream.on("error", reject);
        });
        pdf.stream.pipe(out);
        pdf.title(title, `${name} · ${monthWords(month)} (${from} to ${to}, UK time) · made ${made}`);

        pdf.heading("Summary");
        const monthStages = dashboard.stages;
        const missedInMonth = monthStages.reduce((n, s) => n + s.missed, 0);
        pdf.facts([
          ["Cases open now", String(dashboard.open.total)],
          ["Category 1 hazards open now", String(categoryOne.length)],
          ["New cases this month", String(dashboard.seasonal.reduce((n, r) => n + r.cases, 0))],
          ["Deadlines missed this month", String(missedInMonth)],
          [
            "Repeat cases (within 12 months)",
            `${dashboard.repeats.repeats} of ${dashboard.repeats.cases} (${pct(dashboard.repeats.pct)})`,
          ],
        ]);

        pdf.heading("Deadlines: this month and the last 12 months");
        pdf.paragraph(
          "Each statutory stage of the cases the landlord became aware of in the period: met on time, missed, or still open.",
          { soft: true },
        );
        pdf.table(
          [
            { header: "Stage", width: 0.28 },
            { header: "This month: met", width: 0.12 },
            { header: "missed", width: 0.1 },
            { header: "open", width: 0.1 },
            { header: "12 months: met", width: 0.14 },
            { header: "missed", width: 0.13 },
            { header: "open", width: 0.13 },
          ],
          monthStages.map((s) => {
            const r = rolling.stages.find((x) => x.stage === s.stage);
            return [
              stageLabel(s.stage),
              `${s.met} (${pct(s.metPct)})`,
              `${s.missed} (${pct(s.missedPct)})`,
              String(s.open),
              r ? `${r.met} (${pct(r.metPct)})` : "–",
              r ? `${r.missed} (${pct(r.missedPct)})` : "–",
              r ? String(r.open) : "–",
            ];
          }),
        );

        pdf.heading("Time to act (working days, last 12 months)");
        pdf.table(
          [
            { header: "From awareness to", width: 0.46 },
            { header: "Cases", width: 0.18 },
            { header: "Median", width: 0.18 },
            { header: "90th percentile", width: 0.18 },
          ],
          rolling.durations.map((d) => [
            durationLabels[d.to],
            String(d.cases),
            days(d.medianWorkingDays),
            days(d.p90WorkingDays),
          ]),
        );

        pdf.heading("Category 1 hazards open");
        if (categoryOne.length === 0) pdf.paragraph("No open case has a Category 1 hazard.");
        else
          pdf.table(
            [
              { header: "Case", width: 0.18 },
              { header: "Home", width: 0.3 },
              { header: "Aware since", width: 0.15 },
              { header: "Status", width: 0.15 },
              { header: "Next deadline", width: 0.22 },
            ],
            categoryOne.map((c) => [
              c.reference,
              c.address,
              formatDay(c.awareAt.toISOString()),
              staffStatusLabel(c.status),
              c.nextStage && c.nextDueAt ? `${stageLabel(c.nextStage)}, ${formatDay(c.nextDueAt.toISOString())}` : "None running",
            ]),
          );

        pdf.heading(`Deadlines missed in ${monthWords(month)}`);
        if (inMonth.length === 0) pdf.paragraph("No deadline falling due this month was missed.");
        else
          pdf.table(
            [
              { header: "Case", width: 0.16 },
              { header: "Home", width: 0.2 },
              { header: "Stage", width: 0.13 },
              { header: "Due", width: 0.12 },
              { header: "Done", width: 0.12 },
              { header: "Reason", width: 0.27 },
            ],
            inMonth.map((d) => [
              d.reference,
              d.address,
              stageLabel(d.stage),
              formatDay(d.dueAt.toISOString()),
              d.doneAt ? formatDay(d.doneAt.toISOString()) : "Not yet done",
              reasonOf(d),
            ]),
          );

        pdf.heading(`Complaints raised in ${monthWords(month)}`);
        const cf = dashboard.complaints;
        if (cf.raised === 0) pdf.paragraph("No formal complaint was raised this month.");
        else {
          pdf.paragraph(
            `${cf.raised} raised: ${cf.open} open, ${cf.closed} closed, ${cf.escalated} taken to stage 2; ${cf.apologies} apologies; ` +
              `compensation offered ${pounds(cf.compensationOfferedPence)}, paid ${pounds(cf.compensationPaidPence)}.`,
          );
          pdf.table(
            [
              { header: "Stage", width: 0.1 },
              { header: "Complaints", width: 0.14 },
              { header: "Acknowledged on time / late / overdue", width: 0.3 },
              { header: "Responded on time / late / overdue", width: 0.3 },
              { header: "Extended", width: 0.16 },
            ],
            cf.stages.map((k) => [
              String(k.stage),
              String(k.reached),
              `${k.acknowledgedOnTime} / ${k.acknowledgedLate} / ${k.acknowledgeOverdue}`,
              `${k.respondedOnTime} / ${k.respondedLate} / ${k.respondOverdue}`,
              String(k.extensions),
            ]),
          );
        }

        pdf.heading("Where cases cluster (last 12 months, cases per 100 homes)");
        const top = rolling.hotspots.filter((h) => h.dimension === "estate" || h.dimension === "wallType").slice(0, 40);
        const rows: string[][] = [];
        for (const dim of ["estate", "wallType"] as const) {
          for (const h of top.filter((x) => x.dimension === dim).slice(0, 5))
            rows.push([
              hotspotDimensionLabels[dim],
              hotspotValueLabel(dim, h.value),
              String(h.homes),
              String(h.cases),
              days(h.perHundredHomes),
            ]);
        }
        if (rows.length === 0) pdf.paragraph("No cases in the period.");
        else
          pdf.table(
            [
              { header: "By", width: 0.18 },
              { header: "Group", width: 0.34 },
              { header: "Homes", width: 0.16 },
              { header: "Cases", width: 0.16 },
              { header: "Per 100 homes", width: 0.16 },
            ],
            rows,
          );

        pdf.heading("Workload now");
        const overdue = (list: typeof dashboard.officers) => list.reduce((n, w) => n + w.overdue, 0);
        pdf.facts([
          ["Officers with open cases", `${dashboard.officers.length} (${overdue(dashboard.officers)} cases past a deadline)`],
          [
            "Operatives with open work",
            `${dashboard.operatives.length} (${overdue(dashboard.operatives)} jobs past their target date)`,
          ],
        ]);
        pdf.paragraph(
          "Figures are worked out by Dewline from the landlord's own case records; the dashboard shows the same figures with their tables.",
          { soft: true, size: 8 },
        );
        pdf.finish([`${name} · board report · ${monthWords(month)} · made ${made}`]);
        await done;
      },
    };
  }

  /** The admin's list of addresses the monthly report goes to. */
  async recipients(actor: Actor): Promise<{ recipients: string[]; lastSent: { month: string; sentAt: Date } | null }> {
    const settings = await this.dataSource.getRepository(BoardReportSettings).findOneBy({ organisationId: actor.organisationId });
    const last = await this.dataSource
      .getRepository(BoardReportSend)
      .findOne({ where: { organisationId: actor.organisationId }, order: { month: "DESC" } });
    return { recipients: settings?.recipients ?? [], lastSent: last ? { month: last.month, sentAt: last.sentAt } : null };
  }

  async setRecipients(actor: Actor, list: readonly string[]): Promise<string[]> {
    if (actor.role !== "admin") throw new ForbiddenError("Only an administrator may change who gets the board report.");
    const details: { field: string; message: string }[] = [];
    const clean: string[] = [];
    list.forEach((raw, i) => {
      const r = recipientSchema.safeParse(raw);
      if (!r.success) details.push({ field: `recipients.${i}`, message: `"${raw}" ${r.error.issues[0]!.message}` });
      else if (!clean.includes(r.data)) clean.push(r.data);
    });
    if (clean.length > MAX_RECIPIENTS)
      details.push({
        field: "recipients",
        message: `At most ${MAX_RECIPIENTS} addresses: the report goes to a board, not a mailing list.`,
      });
    if (details.length) throw new ValidationError(details.map((d) => d.message).join(" "), details);
    await this.dataSource.getRepository(BoardReportSettings).save({
      organisationId: actor.organisationId,
      recipients: clean,
      updatedById: actor.id,
      updatedAt: this.clock.now(),
    });
    return clean;
  }

  /**
   * E-mails `month`'s report to the landlord's list. `once`: only if that month's report has not gone
   * yet (the scheduler); the row in board_report_sends and the e-mails commit together, so two
   * instances, or a retry after a crash, never send it twice. Answers how many e-mails were queued.
   */
  async send(actor: Actor, month: string, options: { once?: boolean } = {}): Promise<number> {
    const { recipients } = await this.recipients(actor);
    if (recipients.length === 0) return 0;
    const report = await this.prepare(actor, month);
    const pdf = await toBuffer(report);
    const name = await this.organisations.nameOf(actor.organisationId);
    const delivers = await inTransaction(this.dataSource, async (m) => {
      const result: { affectedRows: number } = await m.query(
        `INSERT ${options.once ? "IGNORE " : ""}INTO board_report_sends (organisation_id, month, sent_at, recipients, sent_by_id)
         VALUES (?, ?, ?, ?, ?)${options.once ? "" : " ON DUPLICATE KEY UPDATE sent_at = VALUES(sent_at), recipients = VALUES(recipients), sent_by_id = VALUES(sent_by_id)"}`,
        [actor.organisationId, month, this.clock.now(), recipients.length, actor.id > 0 ? actor.id : null],
      );
      const affected = result.affectedRows;
      if (options.once && affected === 0) return [];
      const out: (() => Promise<unknown>)[] = [];
      for (const to of recipients) {
        out.push(
          await this.mail.enqueue(m, {
            to,
            template: "boardReport",
            organisationId: actor.organisationId,
            data: {
              organisationName: name,
              monthWords: monthWords(month),
              fileName: report.fileName,
              pdfBase64: pdf.toString("base64"),
            },
          }),
        );
      }
      return out;
    });
    for (const deliver of delivers) await deliver().catch(() => undefined);
    this.logger?.info({ organisationId: actor.organisationId, month, emails: delivers.length }, "board report sent");
    return delivers.length;
  }

  /** The scheduler's run: last month's report to every landlord with a list that has not had it. */
  async sendDue(now = this.clock.now()): Promise<number> {
    const month = previousMonth(now);
    const lists = await this.dataSource.getRepository(BoardReportSettings).find();
    const done = new Set((await this.dataSource.getRepository(BoardReportSend).findBy({ month })).map((s) => s.organisationId));
    let sent = 0;
    for (const s of lists) {
      // Made only where it has not gone yet; the insert in send() still decides between two instances.
      if (s.recipients.length === 0 || done.has(s.organisationId)) continue;
      const system: Actor = { id: 0, email: "", name: "Dewline", role: "admin", organisationId: s.organisationId };
      try {
        sent += await this.send(system, month, { once: true });
      } catch (err) {
        this.logger?.error({ err, organisationId: s.organisationId, month }, "the board report could not be sent");
      }
    }
    return sent;
  }
}

async function toBuffer(report: PreparedBoardReport): Promise<Buffer> {
  const sink = new PassThrough();
  const chunks: Buffer[] = [];
  sink.on("data", (c: Buffer) => chunks.push(c));
  await report.write(sink);
  return Buffer.concat(chunks);
}
