import { computeDeadlines, type Deadline } from "../../../src/lib/domain/deadlines.js";
import { workingDaysBetween } from "../../../src/lib/domain/working-days.js";
import {
  hoursUntilDeadlinePartChanges,
  TRIAGE_WEIGHTS,
  triagePriority,
  type TriagePriority,
  type TriageVulnerability,
} from "../../../src/lib/domain/triage-priority.js";
import type { Actor } from "../auth/actor.js";
import type { AssessmentService } from "../assessments/assessment.service.js";
import type { Case, CaseService, MilestoneFigure } from "../cases/case.service.js";
import type { EvaluationService } from "../evaluation/evaluation.service.js";
import type { InspectionService } from "../inspections/inspection.service.js";
import type { PolicyService } from "../policy/policy.service.js";
import { OPEN_STATUSES } from "../cases/case-queue.schemas.js";
import type { Clock } from "../../lib/clock.js";
import { SURFACE_STATES, type SurfaceState } from "../../../src/lib/domain/surface.js";

/** The sensors' evidence on a case (SensorWatchService, wired in createServices): alerts linked to it. */
export interface SensorEvidence {
  riskOfCase(caseId: number): Promise<{ state: SurfaceState | null; mouldIndex: number | null }>;
}

/** The worse of the readings' and the sensors' judgements: the wetter state and the higher mould index. */
function worseRisk(
  a: { state: SurfaceState | null; mouldIndex: number | null },
  b: { state: SurfaceState | null; mouldIndex: number | null },
): { state: SurfaceState | null; mouldIndex: number | null } {
  const state =
    a.state === null
      ? b.state
      : b.state === null
        ? a.state
        : SURFACE_STATES.indexOf(a.state) >= SURFACE_STATES.indexOf(b.state)
          ? a.state
          : b.state;
  const mouldIndex =
    a.mouldIndex === null ? b.mouldIndex : b.mouldIndex === null ? a.mouldIndex : Math.max(a.mouldIndex, b.mouldIndex);
  return { state, mouldIndex };
}

const HOUR_MS = 3_600_000;
const YEAR_MS = 365 * 24 * HOUR_MS;

/** The earliest deadline not yet done, passed or not; none for a closed or cancelled case. */
export function nextDeadline(status: Case["status"], deadlines: Deadline[]): Deadline | null {
  if (!OPEN_STATUSES.includes(status)) return null;
  const running = deadlines.filter(
    (d) => d.doneAt === null && d.dueAt !== null && (d.state === "pending" || d.state === "missed"),
  );
  running.sort((a, b) => a.dueAt!.getTime() - b.dueAt!.getTime());
  return running[0] ?? null;
}

/**
 * The dashboard's clock projection (case_milestones) from the same deadlines as next_stage: each stage
 * that applies, and the works completed, with the working days from awareness to done.
 */
export function milestoneFigures(c: Pick<Case, "awareAt" | "worksDoneAt">, deadlines: readonly Deadline[]): MilestoneFigure[] {
  const days = (doneAt: Date | null) => (doneAt === null ? null : Math.max(0, workingDaysBetween(c.awareAt, doneAt)));
  const out: MilestoneFigure[] = deadlines
    .filter((d) => d.state !== "not-applicable")
    .map((d) => ({ milestone: d.stage, dueAt: d.dueAt, doneAt: d.doneAt, workingDays: days(d.doneAt) }));
  if (c.worksDoneAt)
    out.push({ milestone: "works-completed", dueAt: null, doneAt: c.worksDoneAt, workingDays: days(c.worksDoneAt) });
  return out;
}

/**
 * The triage figures stored on each case for the queue (risk state, mould index, HHSRS result,
 * recurrence, next deadline, priority).
 *
 * How they stay true: every change to a case writes a CaseEvent, and writing one marks the case's
 * figures stale (CaseService.recordEvent, CaseService.markStale: `triage_due_at` in the past) in the change's own transaction. Readers (the queue, the
 * case page) and a background sweep work stale cases out again. The risk figures come from the rooms'
 * stored evaluations and never wait for a room being worked out again after new readings; storing its
 * newer result marks the case stale again (ReadingService's onReplaced, wired in createServices). A figure that changes with the
 * clock alone (the deadline factor) sets `triage_due_at` to the moment it changes. A refresh writes
 * only if the case is unchanged since it read the facts, so a change made meanwhile is not lost; a
 * process that dies halfway leaves the mark in place for the next reader.
 */
export class TriageService {
  constructor(
    private readonly cases: CaseService,
    private readonly evaluation: EvaluationService,
    private readonly policy: PolicyService,
    private readonly inspections: InspectionService,
    private readonly assessments: AssessmentService,
    private readonly clock: Clock,
  ) {}

  private sensors: SensorEvidence | null = null;
  /** Sensor alerts on a case count with its readings (the sensor-watch module; it depends on triage, not the reverse). */
  useSensorEvidence(sensors: SensorEvidence): void {
    this.sensors = sensors;
  }

  /**
   * Works one case's figures out now and stores them; returns the priority with its parts.
   * The facts are read without holding anything (a refresh never keeps one pooled connection waiting
   * on another); CaseService.storeTriageFigures then takes the case row's lock and writes only if the
   * case has not changed meanwhile (its stale mark and updated_at are as they were). A case changed
   * meanwhile stays marked, and the next reader works it out again.
   */
  async refresh(caseId: number, now = this.clock.now()): Promise<TriagePriority | null> {
    const c = await this.cases.findById(caseId);
    if (!c) return null;
    const seen = { triageDueAt: c.triageDueAt, updatedAt: c.updatedAt };
    const facts = await this.factsFor(c, now);
    const priority = triagePriority(facts.input);
    // The figures change with the clock alone when the deadline part steps, or when a tenant's
    // "it's got worse" stops counting (TRIAGE_WEIGHTS.reportedWorse.withinHours after it).
    const worseAge = facts.input.hoursSinceReportedWorse;
    const worseWithin = TRIAGE_WEIGHTS.reportedWorse.withinHours;
    const moments = [
      hoursUntilDeadlinePartChanges(facts.input.hoursUntilDeadline),
      worseAge !== null && worseAge <= worseWithin ? worseWithin - worseAge : null,
    ].filter((h): h is number => h !== null);
    const changesInHours = moments.length ? Math.min(...moments) : null;
    await this.cases.storeTriageFigures(
      c.id,
      seen,
      {
        riskState: facts.risk.state,
        mouldIndex: facts.risk.mouldIndex === null ? null : Math.round(facts.risk.mouldIndex * 100) / 100,
        hhsrsBand: facts.latestAssessment?.band ?? null,
        hhsrsCategory: (facts.latestAssessment?.category as 1 | 2 | undefined) ?? null,
        recurrence: facts.input.recurrence,
        priority: priority.score,
        nextStage: facts.next?.stage ?? null,
        nextDueAt: facts.next?.dueAt ?? null,
        // 1 ms past the boundary, so the step has certainly been crossed when it is worked out again.
        triageDueAt: changesInHours === null ? null : new Date(now.getTime() + changesInHours * HOUR_MS + 1),
      },
      milestoneFigures(c, facts.deadlines),
    );
    return priority;
  }

  /** Refreshes up to `limit` stale cases (of one landlord, or all); returns how many. */
  async refreshStale(organisationId?: number, limit = 100): Promise<number> {
    const ids = await this.cases.staleIds(organisationId, limit);
    for (const id of ids) await this.refresh(id);
    return ids.length;
  }

  /** Whether any of the landlord's cases has figures due to be worked out again (the queue asks beside its page). */
  async hasStale(organisationId: number): Promise<boolean> {
    return (await this.cases.staleIds(organisationId, 1)).length > 0;
  }

  /** The case page's "how the priority was made up", worked out now. */
  async breakdown(actor: Actor, caseId: number): Promise<TriagePriority & { computedAt: Date }> {
    const c = await this.cases.getForActor(actor, caseId);
    const now = this.clock.now();
    const priority = await this.refresh(c.id, now);
    return { ...priority!, computedAt: now };
  }

  private async factsFor(c: Case, now: Date) {
    const [policy, milestones, readingsRisk, sensorRisk, latestAssessment, recurrence, worse] = await Promise.all([
      this.policy.forOrganisation(c.organisationId),
      this.inspections.milestones(c.id),
      this.evaluation.riskOf(c),
      this.sensors ? this.sensors.riskOfCase(c.id) : { state: null, mouldIndex: null },
      this.assessments.latest(c.id),
      this.cases.hasOtherCaseNear(c, YEAR_MS),
      this.cases.latestEvent(c.id, "tenant-got-worse"),
    ]);
    const risk = worseRisk(readingsRisk, sensorRisk);
    const { source: _source, ...timeframes } = policy;
    const deadlines = computeDeadlines({
      hazardClass: c.hazardClass,
      awareAt: c.awareAt,
      ...milestones,
      now,
      policy: timeframes,
    });
    const next = nextDeadline(c.status, deadlines);
    return {
      risk,
      latestAssessment,
      deadlines,
      next,
      input: {
        surfaceState: risk.state ?? ("unknown" as const),
        mouldIndex: risk.mouldIndex,
        affectedArea: c.area ?? ("unknown" as const),
        vulnerabilities: c.vulnerability === null ? ("skipped" as const) : (c.vulnerability as TriageVulnerability[]),
        hhsrsCategory: (latestAssessment?.category as 1 | 2 | undefined) ?? null,
        recurrence,
        hoursUntilDeadline: next ? (next.dueAt!.getTime() - now.getTime()) / HOUR_MS : null,
        emergency: c.hazardClass === "emergency",
        hoursSinceReportedWorse: worse ? Math.max(0, (now.getTime() - worse.createdAt.getTime()) / HOUR_MS) : null,
      },
    };
  }
}
