// Demo cases for the officers' queue: a month of reports at the fictional landlord, in every state
// of the workflow, dated relative to the day the demo is seeded so the deadlines are always live.
// Every description, reading and finding here is made up for the demo.
import type { EntityManager } from "typeorm";
import { HhsrsAssessmentRecord } from "../../modules/assessments/assessment.entity.js";
import { CaseEvent } from "../../modules/cases/case-event.entity.js";
import { Case } from "../../modules/cases/case.entity.js";
import { formatReference } from "../../modules/cases/case.service.js";
import { Inspection, type Cause } from "../../modules/inspections/inspection.entity.js";
import { Property } from "../../modules/properties/property.entity.js";
import { Reading } from "../../modules/readings/reading.entity.js";
import { Tenancy } from "../../modules/tenancies/tenancy.entity.js";
import { User } from "../../modules/users/user.entity.js";
import { WorkOrderBooking } from "../../modules/works/booking.entity.js";
import { Contractor } from "../../modules/works/contractor.entity.js";
import { OperativeSlot } from "../../modules/works/operative-slot.entity.js";
import { WorkOrder, type WorkOrderType } from "../../modules/works/work-order.entity.js";
import { hhsrsScore, validateAssessment } from "../../../src/lib/domain/hhsrs.js";
import type { Area, CaseStatus, Channel, Location, Observation, Vulnerability } from "../../../src/lib/schemas/case-report.js";
import type { HazardClass } from "../../../src/lib/domain/deadlines.js";
import { mulberry32 } from "../../lib/random.js";

const DAY_MS = 86_400_000;

interface DemoCase {
  /** Index into the landlord's homes (skipping the two named demo tenants' homes). */
  home: number;
  daysAgo: number;
  channel: Channel;
  status: CaseStatus;
  description: string;
  locations: Location[];
  observations: Observation[];
  area: Area | null;
  vulnerability: Vulnerability[] | null;
  hazardClass?: HazardClass;
  /** Readings: "wet" (a cold surface, condensing at night), "damp" (mould-risk), "dry". */
  readings?: "wet" | "damp" | "dry";
  /** Days after awareness the inspection took place. */
  inspectedAfterDays?: number;
  cause?: Cause;
  assessment?: { likelihood: number; spread: [number, number, number, number] };
  assigned?: boolean;
}

// A spread of the month's work: fresh reports, overdue ones, and cases further along.
const PLAN: DemoCase[] = [
  {
    home: 3,
    daysAgo: 0,
    channel: "tenant-online",
    status: "new",
    description: "The bedroom window streams with water every morning and the sill is going black.",
    locations: ["window"],
    observations: ["condensation", "mould-spots"],
    area: "hand",
    vulnerability: [],
    readings: "wet",
  },
  {
    home: 7,
    daysAgo: 1,
    channel: "phone",
    status: "new",
    description: "Black spots spreading across the ceiling above the bath.",
    locations: ["ceiling"],
    observations: ["mould-spots"],
    area: "a4",
    vulnerability: ["breathing-or-immune"],
  },
  {
    home: 11,
    daysAgo: 2,
    channel: "tenant-online",
    status: "new",
    description: "Wallpaper peeling on the outside wall of the child's bedroom, with a musty smell.",
    locations: ["external-wall"],
    observations: ["peeling-paint", "musty-smell"],
    area: "door",
    vulnerability: ["children-under-15"],
    readings: "damp",
  },
  {
    home: 14,
    daysAgo: 3,
    channel: "email",
    status: "new",
    description: "Damp patch low on the hallway wall that has grown since the autumn.",
    locations: ["external-wall"],
    observations: ["wet-patches"],
    area: "a4",
    vulnerability: null,
  },
  {
    home: 19,
    daysAgo: 4,
    channel: "tenant-online",
    status: "new",
    description: "Mould behind the wardrobe on the corner of the room.",
    locations: ["corner"],
    observations: ["mould-spots"],
    area: "hand",
    vulnerability: ["over-65"],
    readings: "damp",
  },
  {
    home: 22,
    daysAgo: 6,
    channel: "letter",
    status: "new",
    description: "Water coming through the kitchen ceiling when it rains hard.",
    locations: ["ceiling"],
    observations: ["leak", "wet-patches"],
    area: "a4",
    vulnerability: [],
  },
  {
    home: 26,
    daysAgo: 9,
    channel: "tenant-online",
    status: "new",
    description: "Condensation running down the living-room walls, carpet edges damp.",
    locations: ["external-wall"],
    observations: ["condensation", "wet-patches"],
    area: "larger",
    vulnerability: ["pregnancy"],
    readings: "wet",
  },
  {
    home: 30,
    daysAgo: 16,
    channel: "phone",
    status: "new",
    description: "Mould on the bathroom ceiling keeps coming back after cleaning.",
    locations: ["ceiling"],
    observations: ["mould-spots"],
    area: "a4",
    vulnerability: ["over-65"],
  },
  {
    home: 33,
    daysAgo: 19,
    channel: "visit",
    status: "new",
    description: "Bedroom wall behind the bed is black; the family's youngest has a cough.",
    locations: ["external-wall"],
    observations: ["mould-spots", "musty-smell"],
    area: "door",
    vulnerability: ["children-under-15"],
    readings: "damp",
  },
  {
    home: 37,
    daysAgo: 23,
    channel: "tenant-online",
    status: "new",
    description: "Green and black mould around the window frames in two rooms.",
    locations: ["window"],
    observations: ["mould-spots"],
    area: "hand",
    vulnerability: [],
  },
  {
    home: 41,
    daysAgo: 5,
    channel: "tenant-online",
    status: "triaged",
    hazardClass: "significant",
    description: "Mould in the corners of both bedrooms.",
    locations: ["corner"],
    observations: ["mould-spots"],
    area: "a4",
    vulnerability: ["children-under-15"],
    readings: "damp",
    assigned: true,
  },
  {
    home: 44,
    daysAgo: 8,
    channel: "phone",
    status: "triaged",
    hazardClass: "significant",
    description: "Wet plaster under the bathroom window.",
    locations: ["window", "external-wall"],
    observations: ["wet-patches"],
    area: "hand",
    vulnerability: [],
    assigned: true,
  },
  {
    home: 48,
    daysAgo: 1,
    channel: "phone",
    status: "triaged",
    hazardClass: "emergency",
    description: "Ceiling bowing and dripping in the kitchen below the bathroom.",
    locations: ["ceiling"],
    observations: ["leak", "wet-patches"],
    area: "larger",
    vulnerability: ["disability"],
    assigned: true,
  },
  {
    home: 52,
    daysAgo: 12,
    channel: "email",
    status: "triaged",
    hazardClass: "not-significant",
    description: "A little condensation on single-glazed windows on cold mornings.",
    locations: ["window"],
    observations: ["condensation"],
    area: "hand",
    vulnerability: [],
    readings: "dry",
  },
  {
    home: 55,
    daysAgo: 7,
    channel: "tenant-online",
    status: "inspection-booked",
    hazardClass: "significant",
    description: "Musty smell and mould on clothes in the bedroom cupboard.",
    locations: ["behind-furniture"],
    observations: ["mould-spots", "musty-smell"],
    area: "a4",
    vulnerability: ["breathing-or-immune"],
    assigned: true,
  },
  {
    home: 58,
    daysAgo: 11,
    channel: "visit",
    status: "inspection-booked",
    hazardClass: "significant",
    description: "Tide mark on the ground-floor wall about knee height.",
    locations: ["external-wall"],
    observations: ["wet-patches", "peeling-paint"],
    area: "door",
    vulnerability: [],
    assigned: true,
  },
  {
    home: 62,
    daysAgo: 9,
    channel: "tenant-online",
    status: "investigated",
    hazardClass: "significant",
    description: "Mould across the bedroom's outside wall; the extractor in the bathroom has stopped.",
    locations: ["external-wall"],
    observations: ["mould-spots", "condensation"],
    area: "door",
    vulnerability: ["children-under-15"],
    readings: "wet",
    inspectedAfterDays: 8,
    cause: "condensation",
    assessment: { likelihood: 32, spread: [0, 21.5, 46.4, 32.1] },
    assigned: true,
  },
  {
    home: 66,
    daysAgo: 13,
    channel: "phone",
    status: "investigated",
    hazardClass: "significant",
    description: "Damp spreading from the corner of the ceiling after a storm.",
    locations: ["ceiling", "corner"],
    observations: ["wet-patches"],
    area: "a4",
    vulnerability: [],
    inspectedAfterDays: 3,
    cause: "roof-gutter",
    assigned: true,
  },
  {
    home: 70,
    daysAgo: 20,
    channel: "tenant-online",
    status: "works-planned",
    hazardClass: "significant",
    description: "Condensation and mould in the kitchen; the cooker hood does not vent outside.",
    locations: ["external-wall", "window"],
    observations: ["condensation", "mould-spots"],
    area: "a4",
    vulnerability: ["over-65"],
    readings: "damp",
    inspectedAfterDays: 5,
    cause: "condensation",
    assessment: { likelihood: 100, spread: [0, 10, 21.5, 68.5] },
    assigned: true,
  },
  {
    home: 74,
    daysAgo: 26,
    channel: "letter",
    status: "works-planned",
    hazardClass: "significant",
    description: "Black mould on the bathroom ceiling and around the bath.",
    locations: ["ceiling"],
    observations: ["mould-spots"],
    area: "a4",
    vulnerability: [],
    inspectedAfterDays: 4,
    cause: "condensation",
    assigned: true,
  },
  {
    home: 78,
    daysAgo: 20,
    channel: "tenant-online",
    status: "monitoring",
    hazardClass: "significant",
    description: "Mould in the back bedroom every winter.",
    locations: ["external-wall", "corner"],
    observations: ["mould-spots"],
    area: "door",
    vulnerability: ["over-65"],
    readings: "wet",
    inspectedAfterDays: 5,
    cause: "condensation",
    assigned: true,
  },
  {
    home: 82,
    daysAgo: 38,
    channel: "phone",
    status: "monitoring",
    hazardClass: "significant",
    description: "Water stains under the kitchen window after rain.",
    locations: ["window"],
    observations: ["wet-patches"],
    area: "hand",
    vulnerability: [],
    readings: "damp",
    inspectedAfterDays: 2,
    cause: "penetrating-damp",
    assigned: true,
  },
  {
    home: 86,
    daysAgo: 45,
    channel: "tenant-online",
    status: "closed",
    hazardClass: "significant",
    description: "Steamed-up windows and mould on the frames.",
    locations: ["window"],
    observations: ["condensation", "mould-spots"],
    area: "hand",
    vulnerability: [],
    inspectedAfterDays: 4,
    cause: "condensation",
  },
  {
    home: 90,
    daysAgo: 60,
    channel: "email",
    status: "closed",
    hazardClass: "not-significant",
    description: "Slight musty smell in the under-stairs cupboard.",
    locations: ["behind-furniture"],
    observations: ["musty-smell"],
    area: "hand",
    vulnerability: [],
    inspectedAfterDays: 6,
    cause: "other-unknown",
  },
  // A second report at the same home as the overdue child's-bedroom case above (a recurrence).
  {
    home: 33,
    daysAgo: 200,
    channel: "phone",
    status: "closed",
    hazardClass: "significant",
    description: "Mould on the bedroom wall behind the bed.",
    locations: ["external-wall"],
    observations: ["mould-spots"],
    area: "a4",
    vulnerability: ["children-under-15"],
    inspectedAfterDays: 5,
    cause: "condensation",
  },
  {
    home: 95,
    daysAgo: 3,
    channel: "tenant-online",
    status: "cancelled",
    description: "Reported twice by mistake.",
    locations: ["window"],
    observations: ["condensation"],
    area: "hand",
    vulnerability: [],
  },
];

/** A week of hourly readings ending at `end`: warm by day, colder at night, in the case's first room. */
function readingsFor(kind: "wet" | "damp" | "dry", caseId: number, roomId: number, end: number, random: () => number) {
  const rows: Partial<Reading>[] = [];
  for (let h = 7 * 24; h >= 0; h--) {
    const at = new Date(Math.floor((end - h * 3_600_000) / 3_600_000) * 3_600_000);
    const night = Math.sin((2 * Math.PI * ((at.getUTCHours() + 6) % 24)) / 24);
    const air = kind === "dry" ? 20.5 + night + random() * 0.4 : 16.5 + 1.5 * night + random() * 0.5;
    const rh =
      kind === "wet"
        ? 74 + 6 * -night + random() * 3
        : kind === "damp"
          ? 68 + 5 * -night + random() * 3
          : 45 + 3 * -night + random() * 2;
    const surface = kind === "wet" ? air - 5.5 - random() : kind === "damp" ? air - 3.5 - random() * 0.5 : air - 1.2;
    rows.push({
      caseId,
      roomId,
      takenAt: at,
      airTemperatureC: Math.round(air * 10) / 10,
      relativeHumidityPct: Math.round(Math.min(rh, 99) * 10) / 10,
      surfaceTemperatureC: Math.round(surface * 10) / 10,
      outdoorTemperatureC: Math.round((5 + 2 * night) * 10) / 10,
      source: "manual",
      importId: null,
    });
  }
  return rows;
}

const INSPECTION_FINDINGS: Record<Cause, string> = {
  condensation:
    "Mould on the coldest parts of the outside wall and around the window reveals. The extract fan was not running and the trickle vents were closed. Surface temperatures well below the room's.",
  "penetrating-damp": "Damp plaster under the window; the external pointing and window sill are cracked and let rain in.",
  "rising-damp": "Tide mark at skirting height on the ground floor; the damp-proof course is bridged by a raised path outside.",
  "plumbing-leak": "Water from a failed seal on the bath above.",
  "roof-gutter": "A blocked gutter overflows onto the wall below; damp spreads from the ceiling corner.",
  "other-unknown": "No damp found at the time of the visit; a musty smell in the cupboard, which was unventilated.",
};

/**
 * Adds the demo cases once (when the landlord has none), inside the seed's transaction. Triage
 * figures are left stale on purpose: the app works them out on first use, exactly as for real cases.
 */
export async function seedDemoCases(m: EntityManager, organisationId: number, now = new Date()): Promise<number> {
  if (await m.getRepository(Case).existsBy({ organisationId })) return 0;
  const random = mulberry32(20261203);
  const homes = await m
    .getRepository(Property)
    .find({ where: { organisationId }, relations: { rooms: true }, order: { id: "ASC" } });
  const tenancies = await m.getRepository(Tenancy).find({ where: {} });
  const tenantAt = new Map(tenancies.map((t) => [t.propertyId, t.tenantUserId]));
  const officer = await m.getRepository(User).findOneByOrFail({ organisationId, role: "officer", email: "officer@example.org" });
  const maintenance = await m
    .getRepository(User)
    .findOneByOrFail({ organisationId, role: "maintenance", email: "maintenance@example.org" });
  let n = 0;
  for (const plan of PLAN) {
    const home = homes[plan.home % homes.length]!;
    const awareAt = new Date(now.getTime() - plan.daysAgo * DAY_MS - Math.floor(random() * 8) * 3_600_000);
    const tenantUserId = tenantAt.get(home.id) ?? null;
    const repo = m.getRepository(Case);
    const row = await repo.save(
      repo.create({
        organisationId,
        propertyId: home.id,
        reporterUserId: plan.channel === "tenant-online" && tenantUserId ? tenantUserId : officer.id,
        tenantUserId,
        channel: plan.channel === "tenant-online" && !tenantUserId ? "phone" : plan.channel,
        awareAt,
        description: plan.description,
        locations: plan.locations,
        observations: plan.observations,
        since: null,
        area: plan.area,
        vulnerability: plan.vulnerability,
        vulnerableHousehold: (plan.vulnerability?.length ?? 0) > 0,
        equipment: null,
        status: plan.status,
        assigneeUserId: plan.assigned ? officer.id : null,
        hazardClass: plan.hazardClass ?? null,
        hazardClassReason: plan.hazardClass ? "Classified at triage from the report and the household." : null,
        reference: null,
        officersAlertedAt: null,
      }),
    );
    row.reference = formatReference(awareAt, row.id);
    await repo.update(row.id, { reference: row.reference });
    const room = home.rooms?.find((r) => r.kind === "bedroom") ?? home.rooms?.[0];
    if (room) await m.createQueryBuilder().relation(Case, "rooms").of(row.id).add([room.id]);
    const events = m.getRepository(CaseEvent);
    await events.save(
      events.create({
        caseId: row.id,
        actorUserId: row.reporterUserId,
        type: "case-created",
        before: null,
        after: {
          reference: row.reference,
          status: "new",
          channel: row.channel,
          awareAt: awareAt.toISOString(),
          description: row.description,
        },
      }),
    );
    if (plan.status !== "new") {
      await events.save(
        events.create({
          caseId: row.id,
          actorUserId: officer.id,
          type: "status-changed",
          before: { status: "new" },
          after: { status: plan.status, reason: "Demo history." },
        }),
      );
    }
    if (plan.readings && room) {
      const end = Math.min(now.getTime(), awareAt.getTime() + DAY_MS);
      await m.getRepository(Reading).insert(readingsFor(plan.readings, row.id, room.id, end, random));
    }
    if (plan.inspectedAfterDays !== undefined && plan.cause) {
      const inspectedAt = new Date(Math.min(now.getTime() - 3_600_000, awareAt.getTime() + plan.inspectedAfterDays * DAY_MS));
      await m.getRepository(Inspection).save({
        caseId: row.id,
        inspectedAt,
        inspectorUserId: officer.id,
        cause: plan.cause,
        mouldExtent: plan.observations.includes("mould-spots") ? "1-to-5-m2" : "none",
        findings: INSPECTION_FINDINGS[plan.cause],
        roomReadings: [],
      });
      await events.save(
        events.create({
          caseId: row.id,
          actorUserId: officer.id,
          type: "inspection-recorded",
          before: null,
          after: { inspectedAt: inspectedAt.toISOString(), cause: plan.cause },
        }),
      );
    }
    if (plan.assessment) {
      const problems = validateAssessment(plan.assessment);
      if (problems.length) throw new Error(`demo assessment for ${row.reference}: ${problems[0]!.message}`);
      const result = hhsrsScore(plan.assessment);
      await m.getRepository(HhsrsAssessmentRecord).save({
        caseId: row.id,
        version: 1,
        assessorUserId: officer.id,
        ...plan.assessment,
        justification: "Demo assessment from the inspection's findings.",
        score: result.score,
        band: result.band,
        category: result.category,
      });
      await events.save(
        events.create({
          caseId: row.id,
          actorUserId: officer.id,
          type: "hhsrs-assessed",
          before: null,
          after: { version: 1, score: result.displayScore, band: result.band, category: result.category },
        }),
      );
    }
    if (plan.status === "works-planned" || plan.status === "monitoring") {
      await seedWorks(m, row, plan, maintenance, room?.id ?? null, awareAt, now, random);
    }
    n++;
  }
  await m.getRepository(Contractor).save([
    {
      organisationId,
      name: "Airflow Ventilation Services",
      email: "bookings@airflow-vent.example.org",
      phone: "01632 960 118",
      trade: "ventilation",
    },
    {
      organisationId,
      name: "Ridgeline Roofing",
      email: "jobs@ridgeline-roofing.example.org",
      phone: null,
      trade: "roofing and gutters",
    },
  ]);
  return n;
}

const WORK_FOR_CAUSE: Partial<Record<Cause, { type: WorkOrderType; description: string }>> = {
  condensation: {
    type: "extractor-fan",
    description:
      "Replace the bathroom extract fan with a continuous-running one with humidity boost, and free the trickle vents.",
  },
  "roof-gutter": {
    type: "roof-gutter",
    description: "Clear and re-align the gutter above the bedroom and repair the downpipe joint.",
  },
  "penetrating-damp": { type: "damp-proofing", description: "Repoint the wall under the kitchen window and reseal the sill." },
};

/** A booked order for works-planned cases; a completed one, with readings after it, for cases being monitored. */
async function seedWorks(
  m: EntityManager,
  c: Case,
  plan: DemoCase,
  maintenance: User,
  roomId: number | null,
  awareAt: Date,
  now: Date,
  random: () => number,
) {
  const work = WORK_FOR_CAUSE[plan.cause ?? "condensation"] ?? WORK_FOR_CAUSE.condensation!;
  const londonDate = (d: Date) => d.toLocaleDateString("en-CA", { timeZone: "Europe/London" });
  const weekdayAfter = (d: Date, days: number) => {
    const x = new Date(d.getTime() + days * DAY_MS);
    while (x.getUTCDay() === 0 || x.getUTCDay() === 6) x.setUTCDate(x.getUTCDate() + 1);
    return x;
  };
  const events = m.getRepository(CaseEvent);
  if (plan.status === "works-planned") {
    const slotDate = londonDate(weekdayAfter(now, 2 + (c.id % 3)));
    const window = c.id % 2 ? "am" : "pm";
    const wo = await m.getRepository(WorkOrder).save({
      organisationId: c.organisationId,
      caseId: c.id,
      type: work.type,
      description: work.description,
      roomIds: roomId ? [roomId] : [],
      priority: "routine",
      targetDate: londonDate(weekdayAfter(now, 5)),
      status: "scheduled",
      assigneeUserId: maintenance.id,
      contractorId: null,
      slotDate,
      slotWindow: window,
      scheduleCount: 1,
      createdById: maintenance.id,
    });
    const booking = await m.getRepository(WorkOrderBooking).save({
      workOrderId: wo.id,
      assigneeUserId: maintenance.id,
      contractorId: null,
      slotDate,
      slotWindow: window,
      state: "active",
      createdById: maintenance.id,
    });
    await m.getRepository(OperativeSlot).insert({ userId: maintenance.id, slotDate, half: window, bookingId: booking.id });
    await events.save(
      events.create({
        caseId: c.id,
        actorUserId: maintenance.id,
        type: "work-order-scheduled",
        before: null,
        after: { workOrderId: wo.id, date: slotDate, window, assignee: maintenance.name },
      }),
    );
    return;
  }
  const doneAt = new Date(
    Math.min(now.getTime() - 8 * DAY_MS, awareAt.getTime() + ((plan.inspectedAfterDays ?? 5) + 6) * DAY_MS),
  );
  const wo = await m.getRepository(WorkOrder).save({
    organisationId: c.organisationId,
    caseId: c.id,
    type: work.type,
    description: work.description,
    roomIds: roomId ? [roomId] : [],
    priority: "routine",
    targetDate: londonDate(doneAt),
    status: "done",
    assigneeUserId: maintenance.id,
    contractorId: null,
    slotDate: londonDate(doneAt),
    slotWindow: "am",
    scheduleCount: 1,
    completedAt: doneAt,
    completedById: maintenance.id,
    completionNote: "Work done as described; tested and left clean.",
    createdById: maintenance.id,
  });
  await m.getRepository(WorkOrderBooking).save({
    workOrderId: wo.id,
    assigneeUserId: maintenance.id,
    contractorId: null,
    slotDate: londonDate(doneAt),
    slotWindow: "am",
    state: "active",
    tenantResponse: "confirmed",
    respondedAt: new Date(doneAt.getTime() - 3 * DAY_MS),
    createdById: maintenance.id,
  });
  await m.getRepository(Case).update(c.id, { worksDoneAt: doneAt, monitoringEndsAt: new Date(doneAt.getTime() + 21 * DAY_MS) });
  await events.save(
    events.create({
      caseId: c.id,
      actorUserId: maintenance.id,
      type: "work-order-completed",
      before: null,
      after: { workOrderId: wo.id, note: "Work done as described; tested and left clean." },
    }),
  );
  await events.save(
    events.create({
      caseId: c.id,
      actorUserId: maintenance.id,
      type: "monitoring-started",
      before: null,
      after: { worksDoneAt: doneAt.toISOString(), days: 21 },
    }),
  );
  // A week of drier readings since the works, for the before/after comparison.
  if (roomId && plan.readings)
    await m
      .getRepository(Reading)
      .insert(readingsFor("dry", c.id, roomId, Math.min(now.getTime(), doneAt.getTime() + 7 * DAY_MS), random));
}
