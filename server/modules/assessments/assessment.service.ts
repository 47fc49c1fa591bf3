import type { DataSource } from "typeorm";
import { hhsrsScore, validateAssessment } from "../../../src/lib/domain/hhsrs.js";
import { ValidationError } from "../../lib/errors.js";
import type { Actor } from "../auth/actor.js";
import type { CaseService } from "../cases/case.service.js";
import { HhsrsAssessmentRecord } from "./assessment.entity.js";

export class AssessmentService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly cases: CaseService,
  ) {}

  /** Scores by the published formula, stores a new version and records it on the case, in one transaction. */
  async assess(
    actor: Actor,
    caseId: number,
    input: { likelihood: number; spread: [number, number, number, number]; justification: string },
  ) {
    const problems = validateAssessment(input);
    if (problems.length) {
      throw new ValidationError(
        problems[0]!.message,
        problems.map((p) => ({ field: p.index === undefined ? p.field : `${p.field}.${p.index}`, message: p.message })),
      );
    }
    const result = hhsrsScore(input);
    return this.dataSource.transaction(async (m) => {
      const c = await this.cases.getForActor(actor, caseId, m);
      const repo = m.getRepository(HhsrsAssessmentRecord);
      // The case row lock serialises versions of one case.
      await this.cases.lockRow(m, c.id);
      const last = await repo.findOne({ where: { caseId: c.id }, order: { version: "DESC" } });
      const saved = await repo.save(
        repo.create({
          caseId: c.id,
          version: (last?.version ?? 0) + 1,
          assessorUserId: actor.id,
          likelihood: input.likelihood,
          spread: input.spread,
          justification: input.justification,
          score: result.score,
          band: result.band,
          category: result.category,
        }),
      );
      await this.cases.recordEvent(m, {
        caseId: c.id,
        actorId: actor.id,
        type: "hhsrs-assessed",
        before: last ? { version: last.version, band: last.band, category: last.category } : null,
        after: { version: saved.version, score: result.displayScore, band: result.band, category: result.category },
      });
      return { record: saved, displayScore: result.displayScore };
    });
  }

  /** The case's latest assessment, or null (no access check: for triage). */
  async latest(caseId: number): Promise<HhsrsAssessmentRecord | null> {
    return this.dataSource.getRepository(HhsrsAssessmentRecord).findOne({ where: { caseId }, order: { version: "DESC" } });
  }

  async list(actor: Actor, caseId: number) {
    const c = await this.cases.getForActor(actor, caseId);
    return this.dataSource.getRepository(HhsrsAssessmentRecord).find({ where: { caseId: c.id }, order: { version: "ASC" } });
  }
}
