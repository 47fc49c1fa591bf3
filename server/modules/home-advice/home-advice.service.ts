import { adviseForHome, type HomeAdvice } from "../../../src/lib/domain/home-advice.js";
import { OPEN_CASE_STATUSES } from "../../../src/lib/domain/case-workflow.js";
import { NotFoundError } from "../../lib/errors.js";
import { isStaff, type Actor } from "../auth/actor.js";
import type { CaseService } from "../cases/case.service.js";
import type { HeatingSupportView } from "../policy/policy.service.js";

/** The landlord's heating support route (PolicyService gives it; this module reads no policy table). */
export interface HeatingSupportSource {
  heatingSupportFor(organisationId: number): Promise<HeatingSupportView>;
}

export interface CaseAdvice extends HomeAdvice {
  caseId: number;
  support: { text: string | null; phone: string | null; link: string | null } | null;
}

/**
 * Works out the advice for one case's home: the one owner of the list, so the tenant and the officer
 * see the same items. Access is the case's own (CaseService.getForActor): staff of its landlord, or
 * the tenant it is about while the case is open; anyone else gets a 404.
 */
export class HomeAdviceService {
  constructor(
    private readonly cases: CaseService,
    private readonly support: HeatingSupportSource,
  ) {}

  async forCase(actor: Actor, caseId: number): Promise<CaseAdvice> {
    const c = await this.cases.getForActor(actor, caseId);
    // Tips for a finished or withdrawn report would read as if the work were still going on; the tenant's
    // page hides them, and the server does not send them either. Staff still see what the tenant was shown.
    if (!isStaff(actor) && !OPEN_CASE_STATUSES.includes(c.status))
      throw new NotFoundError("There is no advice for a report that is finished or withdrawn.");
    const home = c.property;
    // getForActor loads the home and its rooms; a case without them is a programming error, not bad input.
    if (!home) throw new Error(`Case ${c.id} was loaded without its home.`);
    // The rooms the case is about; the whole home's rooms when the report named none.
    const rooms = c.rooms?.length ? c.rooms : (home.rooms ?? []);
    const advice = adviseForHome({
      wallType: home.wallType,
      glazingType: home.glazingType,
      heatingType: home.heatingType,
      ventilation: home.ventilation,
      roomKinds: rooms.map((r) => r.kind),
      riskState: c.riskState,
      observations: c.observations,
      heatingUsable: c.equipment?.heatingUsable ?? null,
      extractorFanWorks: c.equipment?.extractorFanWorks ?? null,
      heatingCost: c.equipment?.heatingCost ?? null,
    });
    let support: CaseAdvice["support"] = null;
    if (advice.offerSupportRoute) {
      const s = await this.support.heatingSupportFor(c.organisationId);
      support = { text: s.supportText, phone: s.supportPhone, link: s.supportLink };
    }
    return { ...advice, caseId: c.id, support };
  }
}
