import type { DataSource } from "typeorm";
import type { z } from "zod";
import {
  HOTSPOT_DIMENSIONS,
  INSIGHT_DURATIONS,
  INSIGHT_STAGES,
  type dashboardResponse,
  type HotspotDimension,
  type whatWorksResponse,
} from "../../../src/lib/contracts/insight.js";
import { OPEN_CASE_STATUSES } from "../../../src/lib/domain/case-workflow.js";
import {
  londonDayStart,
  londonMonths,
  medianOf,
  medianOfValues,
  MIN_GROUP_SIZE,
  percentileOf,
  percentOf,
  perHundredHomes,
  showable,
  totalOf,
  type Frequency,
} from "../../../src/lib/domain/insight-figures.js";
import { localDate } from "../../../src/lib/domain/working-days.js";
import type { Clock } from "../../lib/clock.js";
import type { Actor } from "../auth/actor.js";
import type { ComplaintFigures } from "../complaints/complaint.service.js";
import type { InsightQuery } from "./insight.schemas.js";

/** Works out the stored figures (and the case_milestones projection) a change or the clock marked stale. */
export interface StaleFigures {
  refreshStale(organisationId: number, limit: number): Promise<unknown>;
}

export type Dashboard = z.input<typeof dashboardResponse>;
export type WhatWorks = z.input<typeof whatWorksResponse>;

/** A case open now with a Category 1 hazard (its latest assessment), for the board report. */
export interface OpenCategoryOne {
  caseId: number;
  reference: string;
  address: string;
  awareAt: Date;
  status: string;
  band: string | null;
  nextStage: string | null;
  nextDueAt: Date | null;
}

/** A deadline stage that was missed (done late, or not done and past due). */
export interface MissedDeadline {
  caseId: number;
  reference: string;
  address: string;
  stage: (typeof INSIGHT_STAGES)[number];
  dueAt: Date;
  doneAt: Date | null;
}

/** The complaints raised in a period, with their clocks (ComplaintService.figures). */
export interface ComplaintFigureSource {
  figures(organisationId: number, from: Date, to: Date): Promise<ComplaintFigures>;
}

/** The period and estate a request asks about, resolved to instants. */
export interface Period {
  from: string;
  to: string;
  estate: string | null;
  /** 00:00 London on `from`. */
  start: Date;
  /** 00:00 London on the day after `to`. */
  end: Date;
}

const addDays = (date: string, n: number) => {
  const [y, m, d] = date.split("-").map(Number) as [number, number, number];
  return new Date(Date.UTC(y, m - 1, d + n)).toISOString().slice(0, 10);
};
/** The same day `months` months earlier (the month's last day when shorter). */
const monthsBefore = (date: string, months: number) => {
  const [y, m, d] = date.split("-").map(Number) as [number, number, number];
  const first = new Date(Date.UTC(y, m - 1 - months, 1));
  const last = new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth() + 1, 0)).getUTCDate();
  return new Date(Date.UTC(first.getUTCFullYear(), first.getUTCMonth(), Math.min(d, last))).toISOString().slice(0, 10);
};

/** A UTC instant as MariaDB's DATETIME text (the connection works in UTC). */
const sqlTime = (d: Date) => d.toISOString().slice(0, 23).replace("T", " ");

const OPEN_LIST = OPEN_CASE_STATUSES.map((s) => `'${s}'`).join(", ");
const STAGE_LIST = INSIGHT_STAGES.map((s) => `'${s}'`).join(", ");
/** The milestone each duration ends at (case_milestones): works begun is when the further-work clock stopped. */
const DURATION_MILESTONE: Record<(typeof INSIGHT_DURATIONS)[number], string> = {
  investigation: "investigate",
  summary: "summary",
  "works-begun": "supplementary-work",
  "works-completed": "works-completed",
};

/**
 * The compliance dashboard and "what works": read-only aggregates over a landlord's cases, run in
 * MariaDB (GROUP BY), so 100 000 cases cost a few small result sets. Deadline stages come from the
 * `case_milestones` projection (owned by CaseService, written with the triage figures); their state is
 * worked out here from due, done and now, exactly as computeDeadlines does (met: done by the due time;
 * missed: done after it, or not done and past it; otherwise open).
 *
 * Which cases count (ours): the period and the estate filter every figure except the open-case counts
 * and the workloads, which are as of now (estate only). A case is in the period when the landlord became
 * aware of it then (London dates, inclusive); cancelled cases are left out of the period's figures.
 * Months are London months of awareness.
 */
export class InsightService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly figures: StaleFigures,
    private readonly clock: Clock,
    private readonly complaints: ComplaintFigureSource,
  ) {}

  period(query: InsightQuery, now = this.clock.now()): Period {
    const to = query.to ?? localDate(now);
    const from = query.from ?? addDays(monthsBefore(to, 12), 1);
    return { from, to, estate: query.estate ?? null, start: londonDayStart(from), end: londonDayStart(addDays(to, 1)) };
  }

  async dashboard(actor: Actor, query: InsightQuery): Promise<Dashboard> {
    const now = this.clock.now();
    // Like the queue: figures a change marked stale are worked out before they are counted.
    await this.figures.refreshStale(actor.organisationId, 50);
    const p = this.period(query, now);
    const org = actor.organisationId;
    const months = londonMonths(p.start, p.end);
    const [open, stageRows, durationRows, repeats, hotspotRows, seasonalRows, officers, operatives, estates, complaints] =
      await Promise.all([
        this.openCases(org, p),
        this.stageCounts(org, p, now, months),
        this.durationCounts(org, p),
        this.repeatCounts(org, p),
        this.hotspotCounts(org, p),
        this.seasonalCounts(org, p, months),
        this.officerWorkload(org, p, now),
        this.operativeWorkload(org, p, now),
        this.estates(org),
        this.complaints.figures(org, p.start, p.end),
      ]);

    const stageTotals = new Map<string, { met: number; missed: number; open: number }>();
    const byMonth = new Map<string, { met: number; missed: number; open: number }>();
    for (const r of stageRows) {
      const t = stageTotals.get(r.stage) ?? { met: 0, missed: 0, open: 0 };
      t.met += Number(r.met);
      t.missed += Number(r.missed);
      t.open += Number(r.open);
      stageTotals.set(r.stage, t);
      byMonth.set(`${r.month}|${r.stage}`, { met: Number(r.met), missed: Number(r.missed), open: Number(r.open) });
    }
    const stageRow = <T extends object>(
      stage: (typeof INSIGHT_STAGES)[number],
      c: { met: number; missed: number; open: number },
      extra: T,
    ) => {
      const all = c.met + c.missed + c.open;
      return { ...extra, stage, ...c, metPct: percentOf(c.met, all), missedPct: percentOf(c.missed, all) };
    };
    const zero = { met: 0, missed: 0, open: 0 };

    const freq = new Map<string, Frequency[]>();
    for (const r of durationRows) {
      const list = freq.get(r.milestone) ?? [];
      list.push({ value: Number(r.days), count: Number(r.n) });
      freq.set(r.milestone, list);
    }

    const hotspots = HOTSPOT_DIMENSIONS.flatMap((dimension) =>
      hotspotRows
        .filter((r) => r.d === dimension)
        .map((r) => ({
          dimension,
          value: String(r.v ?? ""),
          homes: Number(r.homes),
          cases: Number(r.cases),
          perHundredHomes: perHundredHomes(Number(r.cases), Number(r.homes)),
        }))
        .sort(
          (a, b) => (b.perHundredHomes ?? -1) - (a.perHundredHomes ?? -1) || b.cases - a.cases || a.value.localeCompare(b.value),
        ),
    );
    const seasonal = new Map(seasonalRows.map((r) => [r.month, Number(r.n)]));

    const tally = (key: "status" | "risk" | "cat") => {
      const m = new Map<string, number>();
      for (const r of open) m.set(String(r[key]), (m.get(String(r[key])) ?? 0) + Number(r.n));
      return [...m].map(([k, count]) => ({ key: k, count })).sort((a, b) => b.count - a.count || a.key.localeCompare(b.key));
    };

    return {
      from: p.from,
      to: p.to,
      estate: p.estate,
      estates,
      generatedAt: now.toISOString(),
      open: {
        total: open.reduce((s, r) => s + Number(r.n), 0),
        byStatus: tally("status"),
        byRisk: tally("risk"),
        byCategory: tally("cat"),
      },
      stages: INSIGHT_STAGES.map((stage) => stageRow(stage, stageTotals.get(stage) ?? zero, {})),
      stagesByMonth: months.flatMap((mo) =>
        INSIGHT_STAGES.map((stage) => stageRow(stage, byMonth.get(`${mo.month}|${stage}`) ?? zero, { month: mo.month })),
      ),
      durations: INSIGHT_DURATIONS.map((to) => {
        const f = freq.get(DURATION_MILESTONE[to]) ?? [];
        return { to, cases: totalOf(f), medianWorkingDays: medianOf(f), p90WorkingDays: percentileOf(f, 90) };
      }),
      repeats: { cases: repeats.n, repeats: repeats.r, pct: percentOf(repeats.r, repeats.n) },
      hotspots,
      seasonal: months.map((mo) => ({ month: mo.month, cases: seasonal.get(mo.month) ?? 0 })),
      officers,
      operatives,
      complaints: {
        raised: complaints.raised,
        open: complaints.open,
        closed: complaints.closed,
        escalated: complaints.escalated,
        apologies: complaints.apologies,
        compensationOfferedPence: complaints.compensation.offeredPence,
        compensationPaidPence: complaints.compensation.paidPence,
        stages: ([1, 2] as const).map((stage) => ({ stage, ...(stage === 1 ? complaints.stage1 : complaints.stage2) })),
      },
    };
  }

  async whatWorks(actor: Actor, query: InsightQuery): Promise<WhatWorks> {
    const p = this.period(query);
    const rows = (await this.dataSource.query(
      `SELECT v.types, v.built_form, v.wall_type, v.glazing_type, COUNT(*) AS n, SUM(v.effective) AS eff,
              GROUP_CONCAT(v.hours_change SEPARATOR ',') AS changes
         FROM (
           SELECT pr.built_form, pr.wall_type, pr.glazing_type,
                  JSON_VALUE(e.after, '$.effective') IN ('true', '1') AS effective,
                  CAST(NULLIF(JSON_VALUE(e.after, '$.hoursAt80PerDayChange'), 'null') AS DOUBLE) AS hours_change,
                  COALESCE((SELECT GROUP_CONCAT(DISTINCT w.type ORDER BY w.type SEPARATOR ',')
                              FROM work_orders w
                             WHERE w.case_id = e.case_id AND w.status = 'done' AND w.completed_at <= e.created_at
                               AND w.completed_at > COALESCE((SELECT MAX(e2.created_at) FROM case_events e2
                                                               WHERE e2.case_id = e.case_id AND e2.type = 'fix-verified'
                                                                 AND e2.created_at < e.created_at), '1000-01-01')), '') AS types
             FROM cases c
             JOIN properties pr ON pr.id = c.property_id
             JOIN case_events e ON e.case_id = c.id AND e.type = 'fix-verified'
            WHERE c.organisation_id = ? AND c.status = 'closed' AND c.aware_at >= ? AND c.aware_at < ?
              ${p.estate === null ? "" : "AND pr.estate = ?"}
         ) v
        GROUP BY v.types, v.built_form, v.wall_type, v.glazing_type`,
      [actor.organisationId, p.start, p.end, ...(p.estate === null ? [] : [p.estate])],
    )) as {
      types: string;
      built_form: string;
      wall_type: string;
      glazing_type: string;
      n: number;
      eff: number;
      changes: string | null;
    }[];
    const shown = rows.filter((r) => showable(Number(r.n)));
    return {
      from: p.from,
      to: p.to,
      estate: p.estate,
      minGroupSize: MIN_GROUP_SIZE,
      groups: shown
        .map((r) => {
          const changes = (r.changes ?? "")
            .split(",")
            .filter((v) => v !== "")
            .map(Number)
            .filter(Number.isFinite);
          return {
            workTypes: r.types ? r.types.split(",") : [],
            builtForm: r.built_form,
            wallType: r.wall_type,
            glazingType: r.glazing_type,
            cases: Number(r.n),
            effective: Number(r.eff),
            effectivePct: percentOf(Number(r.eff), Number(r.n)),
            medianHoursAt80PerDayChange: medianOfValues(changes),
          };
        })
        .sort((a, b) => b.cases - a.cases || (a.effectivePct ?? 0) - (b.effectivePct ?? 0)),
      groupsNotShown: rows.length - shown.length,
    };
  }

  // ── The aggregates (each one statement) ─────────────────────────────────────────────────────────

  /** `c` in the period (and estate), not cancelled; `pr` is the home. */
  private inPeriod(org: number, p: Period): { sql: string; params: unknown[] } {
    return {
      sql: `c.organisation_id = ? AND c.aware_at >= ? AND c.aware_at < ? AND c.status <> 'cancelled'${p.estate === null ? "" : " AND pr.estate = ?"}`,
      params: [org, p.start, p.end, ...(p.estate === null ? [] : [p.estate])],
    };
  }

  private estateClause(p: Period) {
    return { sql: p.estate === null ? "" : " AND pr.estate = ?", params: p.estate === null ? [] : [p.estate] };
  }

  private monthsJson(months: ReturnType<typeof londonMonths>) {
    return JSON.stringify(months.map((m) => ({ m: m.month, s: sqlTime(m.start), e: sqlTime(m.end) })));
  }

  private openCases(org: number, p: Period) {
    const e = this.estateClause(p);
    return this.dataSource.query(
      `SELECT c.status AS status, COALESCE(c.risk_state, 'unknown') AS risk, COALESCE(c.hhsrs_category, 'none') AS cat, COUNT(*) AS n
         FROM cases c JOIN properties pr ON pr.id = c.property_id
        WHERE c.organisation_id = ? AND c.status IN (${OPEN_LIST})${e.sql}
        GROUP BY c.status, c.risk_state, c.hhsrs_category`,
      [org, ...e.params],
    ) as Promise<{ status: string; risk: string; cat: string; n: number }[]>;
  }

  private stageCounts(org: number, p: Period, now: Date, months: ReturnType<typeof londonMonths>) {
    const w = this.inPeriod(org, p);
    return this.dataSource.query(
      `SELECT mo.month AS month, x.milestone AS stage,
              SUM(x.done_at IS NOT NULL AND (x.due_at IS NULL OR x.done_at <= x.due_at)) AS met,
              SUM(x.due_at IS NOT NULL AND (x.done_at > x.due_at OR (x.done_at IS NULL AND x.due_at < ?))) AS missed,
              SUM(x.done_at IS NULL AND (x.due_at IS NULL OR x.due_at >= ?)) AS open
         FROM cases c
         JOIN properties pr ON pr.id = c.property_id
         JOIN case_milestones x ON x.case_id = c.id AND x.milestone IN (${STAGE_LIST})
         JOIN JSON_TABLE(?, '$[*]' COLUMNS (month VARCHAR(7) PATH '$.m', s DATETIME(3) PATH '$.s', e DATETIME(3) PATH '$.e')) mo
           ON c.aware_at >= mo.s AND c.aware_at < mo.e
        WHERE ${w.sql}
        GROUP BY mo.month, x.milestone`,
      [now, now, this.monthsJson(months), ...w.params],
    ) as Promise<{ month: string; stage: string; met: number; missed: number; open: number }[]>;
  }

  private durationCounts(org: number, p: Period) {
    const w = this.inPeriod(org, p);
    return this.dataSource.query(
      `SELECT x.milestone AS milestone, x.working_days AS days, COUNT(*) AS n
         FROM cases c
         JOIN properties pr ON pr.id = c.property_id
         JOIN case_milestones x ON x.case_id = c.id
          AND x.milestone IN ('investigate', 'summary', 'supplementary-work', 'works-completed')
          AND x.working_days IS NOT NULL
        WHERE ${w.sql}
        GROUP BY x.milestone, x.working_days`,
      w.params,
    ) as Promise<{ milestone: string; days: number; n: number }[]>;
  }

  /**
   * A repeat: the same home had another case (not cancelled) known in the 12 months before this one. One
   * pass: each case's previous case at its home (LAG over the period and the 12 months before it), rather
   * than a lookup per case (722 ms, now 202 ms, at 100 000 cases in bench:insight). Two cases of one
   * home known at the same millisecond: the later id counts as a repeat of the other.
   */
  private async repeatCounts(org: number, p: Period): Promise<{ n: number; r: number }> {
    const e = this.estateClause(p);
    const [row] = (await this.dataSource.query(
      `SELECT COUNT(*) AS n, COALESCE(SUM(x.prev_at IS NOT NULL AND x.prev_at >= x.aware_at - INTERVAL 12 MONTH), 0) AS r
         FROM (SELECT c.property_id, c.aware_at,
                      LAG(c.aware_at) OVER (PARTITION BY c.property_id ORDER BY c.aware_at, c.id) AS prev_at
                 FROM cases c
                WHERE c.organisation_id = ? AND c.status <> 'cancelled'
                  AND c.aware_at >= ? - INTERVAL 12 MONTH AND c.aware_at < ?) x
         JOIN properties pr ON pr.id = x.property_id
        WHERE x.aware_at >= ?${e.sql}`,
      [org, p.start, p.end, p.start, ...e.params],
    )) as { n: number; r: number }[];
    return { n: Number(row?.n ?? 0), r: Number(row?.r ?? 0) };
  }

  /**
   * Homes and the period's cases by every combination of the hotspot fields, in one pass; the dimensions
   * are summed from it in Node (seven GROUP BYs over a shared derived table took 728 ms at 100 000 cases, this 244 ms).
   */
  private async hotspotCounts(
    org: number,
    p: Period,
  ): Promise<{ d: HotspotDimension; v: string; homes: number; cases: number }[]> {
    const e = this.estateClause(p);
    const rows = (await this.dataSource.query(
      `SELECT pr.estate, pr.block, pr.built_form, pr.wall_type, pr.glazing_type, pr.heating_type, pr.age_band,
              COUNT(*) AS homes, COALESCE(SUM(k.n), 0) AS cases
         FROM properties pr
         LEFT JOIN (SELECT c.property_id, COUNT(*) AS n FROM cases c
                     WHERE c.organisation_id = ? AND c.aware_at >= ? AND c.aware_at < ? AND c.status <> 'cancelled'
                     GROUP BY c.property_id) k ON k.property_id = pr.id
        WHERE pr.organisation_id = ?${e.sql}
        GROUP BY pr.estate, pr.block, pr.built_form, pr.wall_type, pr.glazing_type, pr.heating_type, pr.age_band`,
      [org, p.start, p.end, org, ...e.params],
    )) as {
      estate: string;
      block: string | null;
      built_form: string;
      wall_type: string;
      glazing_type: string;
      heating_type: string;
      age_band: string | null;
      homes: number;
      cases: number;
    }[];
    const sums = new Map<string, { d: HotspotDimension; v: string; homes: number; cases: number }>();
    for (const r of rows) {
      const values: [HotspotDimension, string | null][] = [
        ["estate", r.estate],
        ["block", r.block ? `${r.estate} / ${r.block}` : null],
        ["builtForm", r.built_form],
        ["wallType", r.wall_type],
        ["glazingType", r.glazing_type],
        ["heatingType", r.heating_type],
        ["ageBand", r.age_band ?? ""],
      ];
      for (const [d, v] of values) {
        if (v === null) continue;
        const key = `${d}|${v}`;
        const sum = sums.get(key) ?? { d, v, homes: 0, cases: 0 };
        sum.homes += Number(r.homes);
        sum.cases += Number(r.cases);
        sums.set(key, sum);
      }
    }
    return [...sums.values()];
  }

  private seasonalCounts(org: number, p: Period, months: ReturnType<typeof londonMonths>) {
    const w = this.inPeriod(org, p);
    return this.dataSource.query(
      `SELECT mo.month AS month, COUNT(*) AS n
         FROM cases c
         JOIN properties pr ON pr.id = c.property_id
         JOIN JSON_TABLE(?, '$[*]' COLUMNS (month VARCHAR(7) PATH '$.m', s DATETIME(3) PATH '$.s', e DATETIME(3) PATH '$.e')) mo
           ON c.aware_at >= mo.s AND c.aware_at < mo.e
        WHERE ${w.sql}
        GROUP BY mo.month`,
      [this.monthsJson(months), ...w.params],
    ) as Promise<{ month: string; n: number }[]>;
  }

  /** Open cases assigned to each person, and how many of them have a deadline passed undone. */
  private async officerWorkload(org: number, p: Period, now: Date) {
    const e = this.estateClause(p);
    const rows = (await this.dataSource.query(
      `SELECT u.id AS id, u.name AS name, COUNT(*) AS open, SUM(c.next_due_at IS NOT NULL AND c.next_due_at < ?) AS overdue
         FROM cases c
         JOIN properties pr ON pr.id = c.property_id
         JOIN users u ON u.id = c.assignee_user_id
        WHERE c.organisation_id = ? AND c.status IN (${OPEN_LIST})${e.sql}
        GROUP BY u.id, u.name`,
      [now, org, ...e.params],
    )) as { id: number; name: string; open: number; overdue: number }[];
    return workload(rows);
  }

  /** Work orders not done or cancelled assigned to each operative, and how many are past their target date (London). */
  private async operativeWorkload(org: number, p: Period, now: Date) {
    const e = this.estateClause(p);
    const rows = (await this.dataSource.query(
      `SELECT u.id AS id, u.name AS name, COUNT(*) AS open, SUM(w.target_date < ?) AS overdue
         FROM work_orders w
         JOIN cases c ON c.id = w.case_id
         JOIN properties pr ON pr.id = c.property_id
         JOIN users u ON u.id = w.assignee_user_id
        WHERE w.organisation_id = ? AND w.status NOT IN ('done', 'cancelled')${e.sql}
        GROUP BY u.id, u.name`,
      [localDate(now), org, ...e.params],
    )) as { id: number; name: string; open: number; overdue: number }[];
    return workload(rows);
  }

  /** Cases open now whose latest HHSRS assessment puts them in Category 1, the oldest first. */
  async openCategoryOne(organisationId: number): Promise<OpenCategoryOne[]> {
    const rows = (await this.dataSource.query(
      `SELECT c.id, c.reference, c.aware_at, c.status, c.next_stage, c.next_due_at, c.hhsrs_band,
              pr.address_line1, pr.postcode
         FROM cases c JOIN properties pr ON pr.id = c.property_id
        WHERE c.organisation_id = ? AND c.hhsrs_category = 1 AND c.status IN (${OPEN_LIST})
        ORDER BY c.aware_at, c.id`,
      [organisationId],
    )) as Record<string, unknown>[];
    return rows.map((r) => ({
      caseId: Number(r.id),
      reference: (r.reference as string | null) ?? `#${Number(r.id)}`,
      address: [r.address_line1, r.postcode].filter(Boolean).join(", "),
      awareAt: new Date(r.aware_at as Date),
      status: r.status as string,
      band: (r.hhsrs_band as string | null) ?? null,
      nextStage: (r.next_stage as string | null) ?? null,
      nextDueAt: r.next_due_at ? new Date(r.next_due_at as Date) : null,
    }));
  }

  /**
   * Deadline stages due in [start, end) that were missed: done after their due time, or not done and
   * past it at `now`; the earliest due first.
   */
  async missedDeadlines(organisationId: number, start: Date, end: Date): Promise<MissedDeadline[]> {
    const now = this.clock.now();
    const rows = (await this.dataSource.query(
      `SELECT m.case_id, m.milestone, m.due_at, m.done_at, c.reference, pr.address_line1, pr.postcode
         FROM case_milestones m
         JOIN cases c ON c.id = m.case_id
         JOIN properties pr ON pr.id = c.property_id
        WHERE m.organisation_id = ? AND m.milestone IN (${STAGE_LIST})
          AND m.due_at >= ? AND m.due_at < ?
          AND ((m.done_at IS NOT NULL AND m.done_at > m.due_at) OR (m.done_at IS NULL AND m.due_at < ?))
        ORDER BY m.due_at, m.case_id`,
      [organisationId, sqlTime(start), sqlTime(end), sqlTime(now)],
    )) as Record<string, unknown>[];
    return rows.map((r) => ({
      caseId: Number(r.case_id),
      reference: (r.reference as string | null) ?? `#${Number(r.case_id)}`,
      address: [r.address_line1, r.postcode].filter(Boolean).join(", "),
      stage: r.milestone as (typeof INSIGHT_STAGES)[number],
      dueAt: new Date(r.due_at as Date),
      doneAt: r.done_at ? new Date(r.done_at as Date) : null,
    }));
  }

  private async estates(org: number): Promise<string[]> {
    const rows = (await this.dataSource.query(
      "SELECT DISTINCT estate FROM properties WHERE organisation_id = ? ORDER BY estate",
      [org],
    )) as { estate: string }[];
    return rows.map((r) => r.estate);
  }
}

function workload(rows: { id: number; name: string; open: number; overdue: number }[]) {
  return rows
    .map((r) => ({ id: Number(r.id), name: r.name, open: Number(r.open), overdue: Number(r.overdue) }))
    .sort((a, b) => b.overdue - a.overdue || b.open - a.open || a.name.localeCompare(b.name));
}
