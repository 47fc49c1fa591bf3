import { createHash } from "node:crypto";
import type { Readable, Writable } from "node:stream";
import { computeDeadlines } from "../../../src/lib/domain/deadlines.js";
import { EVIDENCE_PACK_DEFINITION } from "../../../src/lib/contracts/evidence-pack.js";
import type { Clock } from "../../lib/clock.js";
import { ConflictError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import { PdfWriter } from "../../lib/pdf/pdf-document.js";
import { inTransaction } from "../../lib/transaction.js";
import type { DataSource } from "typeorm";
import type { AssessmentService } from "../assessments/assessment.service.js";
import type { ComplaintService } from "../complaints/complaint.service.js";
import type { Actor } from "../auth/actor.js";
import { addressOf, type CaseService } from "../cases/case.service.js";
import type { ConversationService } from "../conversation/conversation.service.js";
import { ENGINE_SOURCES, type EvaluationService } from "../evaluation/evaluation.service.js";
import type { InspectionService } from "../inspections/inspection.service.js";
import type { OrganisationService } from "../organisations/organisation.service.js";
import type { PhotoService } from "../photos/photo.service.js";
import type { PolicyService } from "../policy/policy.service.js";
import type { ReadingService } from "../readings/reading.service.js";
import type { UserService } from "../users/user.service.js";
import type { VerificationService } from "../works/verification.service.js";
import type { WorkOrderService } from "../works/work-order.service.js";
import { canonicalJson } from "./canonical-json.js";
import { renderEvidencePack, type PhotoBytes } from "./evidence-pack.render.js";

const iso = (d: Date | string | null | undefined): string | null =>
  d === null || d === undefined ? null : typeof d === "string" ? d : d.toISOString();

async function sha256OfStream(body: Readable): Promise<string> {
  const hash = createHash("sha256");
  for await (const chunk of body) hash.update(chunk as Buffer);
  return hash.digest("hex");
}

/** Everything the pack states, as it is hashed (see EVIDENCE_PACK_DEFINITION). */
export type PackFacts = Awaited<ReturnType<EvidencePackService["facts"]>>["facts"];

export interface PackMade {
  sha256: string;
  pages: number;
  fileName: string;
}

/**
 * The case evidence pack: every fact of one case, read through the services that own each one,
 * written as one PDF. Its hash (EVIDENCE_PACK_DEFINITION) is printed on every page and recorded on
 * the case's timeline.
 */
export class EvidencePackService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly deps: {
      cases: CaseService;
      photos: PhotoService;
      readings: ReadingService;
      evaluation: EvaluationService;
      assessments: AssessmentService;
      inspections: InspectionService;
      policy: PolicyService;
      conversation: ConversationService;
      works: WorkOrderService;
      verification: VerificationService;
      users: UserService;
      organisations: OrganisationService;
      complaints: Pick<ComplaintService, "historyOfCase">;
    },
    private readonly clock: Clock,
    private readonly logger: Logger,
  ) {}

  /** The case's facts and where each photo's bytes are. Access: staff of the case's landlord (404 otherwise). */
  async facts(actor: Actor, caseId: number) {
    const d = this.deps;
    const c = await d.cases.getForActor(actor, caseId);
    const now = this.clock.now();
    const home = c.property!;
    const rooms = d.cases.roomsOf(c);
    const roomName = new Map(rooms.map((r) => [r.id, r.name]));
    const organisationName = await d.organisations.nameOf(c.organisationId);

    const events = await d.cases.events(actor, c.id);
    const photos = await d.photos.listForCase(actor, c.id);
    const assessments = await d.assessments.list(actor, c.id);
    const inspections = await d.inspections.list(actor, c.id);
    const conversation = await d.conversation.conversation(actor, c.id);
    const orders = await d.works.listForCase(actor, c.id);
    const worksContext = await d.works.context(orders);
    const verification = await d.verification.view(actor, c.id);
    const evaluation = await d.evaluation.forCase(actor, c.id);
    const readings = await d.readings.list(c.id, { limit: 1_000_000 });
    const milestones = await d.inspections.milestones(c.id);
    const complaints = await d.complaints.historyOfCase(c.id, c.organisationId);
    const { source: _source, ...timeframes } = await d.policy.forOrganisation(c.organisationId);
    const deadlines = computeDeadlines({
      hazardClass: c.hazardClass,
      awareAt: c.awareAt,
      ...milestones,
      now,
      policy: timeframes,
    });

    const people = await d.users.people(
      [
        c.tenantUserId,
        c.reporterUserId,
        c.assigneeUserId,
        ...photos.map((p) => p.uploadedById),
        ...assessments.map((a) => a.assessorUserId),
        ...inspections.map((i) => i.inspectorUserId),
        ...orders.map((o) => o.createdById),
        ...complaints.map((x) => x.complaint.raisedByUserId),
      ].filter((v): v is number => typeof v === "number"),
    );
    const nameOf = (id: number | null | undefined) => (id === null || id === undefined ? null : (people.get(id)?.name ?? null));

    const photoFacts = [];
    for (const p of photos) {
      // Read from the photo store (disk or S3) now, so a missing photo is refused before the first byte.
      const stored = await d.photos.open(actor, p.id, "display");
      photoFacts.push({
        id: p.id,
        addedAt: iso(p.createdAt),
        addedBy: nameOf(p.uploadedById),
        workOrderId: p.workOrderId,
        width: p.width,
        height: p.height,
        // Of the bytes read now, the ones the PDF embeds (checked again as they are embedded).
        sha256: await sha256OfStream(stored.body),
      });
    }

    const facts = {
      definition: EVIDENCE_PACK_DEFINITION.id,
      landlord: organisationName,
      case: {
        id: c.id,
        reference: c.reference,
        status: c.status,
        channel: c.channel,
        awareAt: iso(c.awareAt),
        reportedAt: iso(c.createdAt),
        reportedBy: nameOf(c.reporterUserId),
        tenant: nameOf(c.tenantUserId),
        assignee: nameOf(c.assigneeUserId),
        hazardClass: c.hazardClass,
        hazardClassReason: c.hazardClassReason,
      },
      home: {
        address: [home.addressLine1, home.addressLine2, home.town, home.postcode].filter(Boolean).join(", "),
        uprn: home.uprn,
        estate: home.estate,
        block: home.block,
        builtForm: home.builtForm,
        wallType: home.wallType,
        wallInsulation: home.wallInsulation,
        glazingType: home.glazingType,
        heatingType: home.heatingType,
        heatingFuel: home.heatingFuel,
        ventilation: home.ventilation,
        builtYear: home.builtYear,
        ageBand: home.ageBand,
        roofInsulationMm: home.roofInsulationMm,
        hasExtractFans: home.hasExtractFans,
        hasTrickleVents: home.hasTrickleVents,
        epcBand: home.epcBand,
        rooms: rooms.map((r) => ({ id: r.id, name: r.name, kind: r.kind })),
      },
      report: {
        description: c.description,
        rooms: (c.rooms ?? []).map((r) => r.name),
        locations: c.locations,
        observations: c.observations,
        since: c.since,
        area: c.area,
        vulnerability: c.vulnerability,
        equipment: c.equipment,
        gotWorse: events
          .filter(({ event }) => event.type === "tenant-got-worse")
          .map(({ event, actor: who }) => ({
            at: iso(event.createdAt),
            by: who?.name ?? null,
            note: String(event.after?.note ?? ""),
          })),
      },
      photos: photoFacts,
      readings: {
        count: readings.length,
        columns: ["takenAt", "room", "airTemperatureC", "relativeHumidityPct", "surfaceTemperatureC", "outdoorTemperatureC"],
        rows: readings.map((r) => [
          iso(r.takenAt),
          roomName.get(r.roomId) ?? String(r.roomId),
          r.airTemperatureC,
          r.relativeHumidityPct,
          r.surfaceTemperatureC,
          r.outdoorTemperatureC,
        ]),
      },
      evaluation: {
        statement: evaluation.statement,
        sources: ENGINE_SOURCES,
        rooms: evaluation.rooms.map((r) => ({
          room: r.roomName,
          readingsCount: r.readingsCount,
          evaluatedAt: r.evaluatedAt,
          surfaces: r.surfaces.map((s) => ({ element: s.label, result: s.result })),
          series: r.series,
        })),
      },
      assessments: assessments.map((a) => ({
        version: a.version,
        at: iso(a.createdAt),
        by: nameOf(a.assessorUserId),
        likelihood: a.likelihood,
        spread: a.spread,
        score: Math.trunc(a.score * 100) / 100,
        band: a.band,
        category: a.category,
        justification: a.justification,
      })),
      inspections: inspections.map((i) => ({
        at: iso(i.inspectedAt),
        by: nameOf(i.inspectorUserId),
        cause: i.cause,
        mouldExtent: i.mouldExtent,
        findings: i.findings,
        rooms: i.roomReadings.map((r) => ({ ...r, room: roomName.get(r.roomId) ?? String(r.roomId) })),
      })),
      letters: events
        .filter(({ event }) => event.type === "summary-sent")
        .map(({ event, actor: who, email }) => ({
          kind: "written summary",
          at: iso(event.createdAt),
          by: who?.name ?? null,
          body: String(event.after?.body ?? ""),
          delivery: email?.status ?? null,
        })),
      messages: conversation.entries
        .filter((m) => m.kind !== "summary")
        .map((m) => ({
          kind: m.kind,
          internal: m.kind === "internal-note",
          at: iso(m.at),
          by: m.author?.name ?? null,
          body: m.body,
          photoIds: m.photoIds,
          readBy: m.readBy.map((r) => ({ name: r.name, at: iso(r.readAt) })),
        })),
      emails: events
        .filter(({ event }) => event.type === "email-queued" || event.type === "email-resent")
        .map(({ event, actor: who, email }) => ({
          at: iso(event.createdAt),
          by: who?.name ?? null,
          resent: event.type === "email-resent",
          to: String(event.after?.to ?? ""),
          template: String(event.after?.template ?? ""),
          status: email?.status ?? "unknown",
          sentAt: email?.sentAt ?? null,
          attempts: email?.attempts ?? null,
          error: email?.error ?? null,
        })),
      deadlines: deadlines.map((x) => ({ stage: x.stage, dueAt: iso(x.dueAt), doneAt: iso(x.doneAt), state: x.state })),
      complaints: complaints.map(({ complaint: x, clocks }) => ({
        id: x.id,
        status: x.status,
        raisedAt: iso(x.raisedAt),
        raisedBy: nameOf(x.raisedByUserId),
        onBehalf: x.onBehalf,
        description: x.description,
        stages: clocks.map((k, i) => ({
          stage: k.stage,
          acknowledgeDueAt: iso(k.acknowledgeDueAt),
          acknowledgedAt: iso(k.acknowledgedAt),
          acknowledge: k.acknowledge,
          respondDueAt: iso(k.respondDueAt),
          respondedAt: iso(k.respondedAt),
          respond: k.respond,
          extensionWorkingDays: k.extensionWorkingDays,
          extensionReason: i === 0 ? x.stage1ExtensionReason : x.stage2ExtensionReason,
          response: i === 0 ? x.stage1Response : x.stage2Response,
        })),
        escalatedAt: iso(x.escalatedAt),
        escalationReason: x.escalationReason,
        closedAt: iso(x.closedAt),
        remedy: {
          apology: x.apology,
          apologyText: x.apologyText,
          putRight: x.putRight,
          compensationOfferedPence: x.compensationOfferedPence,
          compensationOfferedOn: x.compensationOfferedOn,
          compensationAcceptedOn: x.compensationAcceptedOn,
          compensationPaidPence: x.compensationPaidPence,
          compensationPaidOn: x.compensationPaidOn,
        },
        staffNote: x.staffNote,
      })),
      deadlinesAsOf: iso(now),
      works: orders.map((o) => ({
        id: o.id,
        type: o.type,
        description: o.description,
        priority: o.priority,
        targetDate: o.targetDate,
        status: o.status,
        raisedAt: iso(o.createdAt),
        raisedBy: nameOf(o.createdById),
        rooms: o.roomIds.map((r) => roomName.get(r) ?? String(r)),
        bookings: (worksContext.bookings.get(o.id) ?? []).map((b) => ({
          date: b.slotDate,
          window: b.slotWindow,
          state: b.state,
          tenantResponse: b.tenantResponse,
          tenantReason: b.tenantReason,
          operative: b.assigneeUserId === null ? null : (worksContext.users.get(b.assigneeUserId)?.name ?? null),
          contractor: b.contractorId === null ? null : (worksContext.contractors.get(b.contractorId)?.name ?? null),
        })),
        completedAt: iso(o.completedAt),
        doneOn: o.doneOn,
        completedBy: o.completedById === null ? null : (worksContext.users.get(o.completedById)?.name ?? null),
        earlyReason: o.earlyReason,
        completionNote: o.completionNote,
        materials: o.materials,
        minutesOnSite: o.minutesOnSite,
        followOn: o.followOn,
      })),
      verification: {
        state: verification.state,
        worksDoneAt: verification.worksDoneAt,
        monitoringEndsAt: verification.monitoringEndsAt,
        monitoringDays: verification.monitoringDays,
        rooms: verification.rooms.map((r) => ({
          room: r.roomName,
          before: r.comparison.before,
          after: r.comparison.after,
          improved: r.comparison.improved,
        })),
        outcome: verification.outcome,
      },
      timeline: events.map(({ event, actor: who }) => ({ at: iso(event.createdAt), type: event.type, by: who?.name ?? null })),
    };
    return { facts, organisationName, address: addressOf(home), reference: c.reference ?? `case-${c.id}` };
  }

  /**
   * Writes the case's pack to `out` as it is made (pdfkit pushes while the caller pipes), and records
   * it on the timeline once written. Access is checked and every fact read before the first byte, so
   * a refusal is an ordinary error reply.
   */
  async prepare(actor: Actor, caseId: number) {
    const gathered = await this.facts(actor, caseId);
    const json = Buffer.from(canonicalJson(gathered.facts), "utf8");
    const sha256 = createHash("sha256").update(json).digest("hex");
    const fileName = `${gathered.reference}-evidence-pack.pdf`;
    const madeAt = this.clock.now();
    const author = (await this.deps.users.people([actor.id])).get(actor.id)?.name ?? "";

    const write = async (out: Writable): Promise<PackMade> => {
      const pdf = new PdfWriter({
        title: `Evidence pack · ${gathered.reference}`,
        organisationName: gathered.organisationName,
        createdAt: madeAt,
      });
      pdf.stream.pipe(out);
      const photoBytes: PhotoBytes = async (photoId) => {
        const data = await this.deps.photos.bytes(actor, photoId, "display");
        const expected = gathered.facts.photos.find((p) => p.id === photoId)!.sha256;
        if (createHash("sha256").update(data).digest("hex") !== expected) {
          throw new ConflictError("A photo changed while the evidence pack was being made. Please try again.");
        }
        await drained(pdf.stream, out);
        if (out.destroyed) throw new ReaderGoneError();
        return data;
      };
      await renderEvidencePack(pdf, gathered.facts, { sha256, madeAt, madeBy: author, photoBytes });
      pdf.attach(
        json,
        "facts.json",
        "The facts this pack states, as hashed: its SHA-256 is the hash printed on every page.",
        "application/json",
      );
      // A download given up on is not recorded as a pack made.
      if (out.destroyed) throw new ReaderGoneError();
      const made = { sha256, pages: pdf.pageCount, fileName };
      await inTransaction(this.dataSource, (m) =>
        this.deps.cases.recordEvent(m, { caseId, actorId: actor.id, type: "evidence-pack-made", after: made }),
      );
      this.logger.info({ caseId, sha256, pages: made.pages }, "evidence pack made");
      pdf.finish([`Content SHA-256 ${sha256}`, `${gathered.reference} · ${gathered.address} · made by ${author}`]);
      return made;
    };
    return { fileName, sha256, write };
  }
}

/** The response closed before the pack was finished: stop making it. */
export class ReaderGoneError extends Error {
  constructor() {
    super("The reader of the evidence pack went away before it was finished.");
  }
}

/** Waits while more than a few megabytes wait unread in pdfkit's buffer (a slow reader), so photos are not heaped up. */
async function drained(readable: NodeJS.ReadableStream & { readableLength: number }, out: Writable): Promise<void> {
  while (readable.readableLength > 4 * 1024 * 1024 && !out.destroyed) {
    await new Promise<void>((resolve) => {
      // Drain (or the reader gone); a short timer too, in case nothing was waiting on the socket.
      const timer = setTimeout(() => done(), 100);
      const done = () => {
        clearTimeout(timer);
        out.off("drain", done);
        out.off("close", done);
        resolve();
      };
      out.once("drain", done);
      out.once("close", done);
    });
  }
}
