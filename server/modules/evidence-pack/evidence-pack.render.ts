// The evidence pack's pages, from its facts: one function per section, in the order of the pack.
import { EVIDENCE_PACK_DEFINITION } from "../../../src/lib/contracts/evidence-pack.js";
import { formatDate, formatDateTimeZoned } from "../../../src/lib/dates.js";
import { vapourPressurePa } from "../../../src/lib/domain/psychrometrics.js";
import { surfaceRelativeHumidityPct } from "../../../src/lib/domain/surface.js";
import type { PdfWriter } from "../../lib/pdf/pdf-document.js";
import type { PackFacts } from "./evidence-pack.service.js";

/** A photo's bytes, read when it is placed (one at a time). */
export type PhotoBytes = (photoId: number) => Promise<Buffer>;

/** Every section heading, in order (tests read them back from the PDF). */
export const SECTION_HEADINGS = [
  "The home",
  "The household's report",
  "Photos",
  "Readings",
  "The engine's evaluation",
  "HHSRS assessments",
  "Inspections",
  "Letters and the written summary",
  "Messages and internal notes",
  "E-mails and their delivery",
  "Deadlines",
  "Works",
  "Verification of the works",
  "Complaints",
  "Timeline",
  "About this pack",
] as const;
type Heading = (typeof SECTION_HEADINGS)[number];

const INTERNAL = "Internal, staff only";
const when = (at: string | null | undefined) => (at ? formatDateTimeZoned(at) : "—");
const day = (at: string | null | undefined) => (at ? formatDate(at) : "—");
const orDash = (v: unknown) => (v === null || v === undefined || v === "" ? "—" : String(v));
/** Stored values in plain words: "mid-terrace" → "mid terrace", "caseAlert" → "case alert". */
const words = (v: string | null | undefined) =>
  v
    ? v
        .replaceAll("-", " ")
        .replace(/([a-z])([A-Z])/g, "$1 $2")
        .toLowerCase()
    : "—";
const list = (v: readonly string[] | null | undefined) => (v && v.length ? v.map((x) => x.replaceAll("-", " ")).join(", ") : "—");
const yesNo = (v: boolean | null | undefined) => (v === null || v === undefined ? "—" : v ? "Yes" : "No");

const STAGE_WORDS: Record<string, string> = {
  "make-safe": "Make safe",
  investigate: "Investigate",
  summary: "Written summary",
  "safety-work": "Safety work begun",
  "supplementary-work": "Supplementary work begun",
};
const STATE_WORDS: Record<string, string> = {
  pending: "Pending",
  met: "Met",
  missed: "Missed",
  "not-applicable": "Not applicable",
};
const MESSAGE_WORDS: Record<string, string> = {
  "from-tenant": "From the household",
  "to-tenant": "To the household",
  "internal-note": INTERNAL,
};
const ROOM_COLOURS = ["#1d4ed8", "#b45309", "#047857", "#7c3aed", "#be123c", "#0e7490"];

interface PackContext {
  sha256: string;
  madeAt: Date;
  madeBy: string;
  photoBytes: PhotoBytes;
}

type Section = (pdf: PdfWriter, facts: PackFacts, ctx: PackContext) => void | Promise<void>;

const cover: Section = (pdf, f, ctx) => {
  pdf.title(`Case evidence pack: ${f.case.reference}`, `${f.landlord} · ${f.home.address}`);
  pdf.facts([
    ["Case", orDash(f.case.reference)],
    ["Status", words(f.case.status)],
    ["Landlord aware", when(f.case.awareAt)],
    ["Reported", `${when(f.case.reportedAt)} by ${orDash(f.case.reportedBy)} (${words(f.case.channel)})`],
    ["Tenant", orDash(f.case.tenant)],
    ["Case officer", orDash(f.case.assignee)],
    ["Hazard classification", words(f.case.hazardClass)],
    ...(f.case.hazardClassReason ? ([[`Classification reason (${INTERNAL})`, f.case.hazardClassReason]] as const) : []),
    ["Pack made", `${when(ctx.madeAt.toISOString())} by ${ctx.madeBy}`],
    ["Content SHA-256", ctx.sha256],
  ]);
  pdf.paragraph(
    "A staff document: it includes internal notes and staff-only text, each labelled as internal. Times are London time.",
    { soft: true },
  );
};

const sections: Record<Heading, Section> = {
  "The home": (pdf, f) => {
    const h = f.home;
    pdf.facts([
      ["Address", h.address],
      ["UPRN", orDash(h.uprn)],
      ["Estate and block", [h.estate, h.block].filter(Boolean).join(", ") || "—"],
      ["Built form", words(h.builtForm)],
      ["Walls", `${words(h.wallType)}${h.wallInsulation ? `, ${words(h.wallInsulation)}` : ""}`],
      ["Glazing", words(h.glazingType)],
      ["Heating", `${words(h.heatingType)}${h.heatingFuel ? `, ${words(h.heatingFuel)}` : ""}`],
      ["Ventilation", words(h.ventilation)],
      ["Extract fans / trickle vents", `${yesNo(h.hasExtractFans)} / ${yesNo(h.hasTrickleVents)}`],
      ["Built", orDash(h.builtYear ?? h.ageBand)],
      ["Roof insulation", h.roofInsulationMm === null ? "—" : `${h.roofInsulationMm} mm`],
      ["EPC band", orDash(h.epcBand)],
      ["Rooms", h.rooms.map((r) => r.name).join(", ") || "—"],
    ]);
  },
  "The household's report": (pdf, f) => {
    const r = f.report;
    pdf.paragraph("In the household's own words:", { soft: true });
    pdf.paragraph(`“${r.description}”`);
    pdf.facts([
      ["Rooms", list(r.rooms)],
      ["Where", list(r.locations)],
      ["What they see", list(r.observations)],
      ["Since", words(r.since)],
      ["Area", words(r.area)],
      ["Household", list(r.vulnerability)],
      ["Heating, fan and vents", r.equipment ? JSON.stringify(r.equipment).replace(/[{}"]/g, "").replaceAll(",", ", ") : "—"],
    ]);
    for (const w of r.gotWorse) pdf.paragraph(`“${w.note}”`, { label: `It has got worse (${when(w.at)}, ${orDash(w.by)})` });
  },
  Photos: async (pdf, f, ctx) => {
    if (f.photos.length === 0) {
      pdf.paragraph("No photos on this case.");
      return;
    }
    pdf.paragraph(
      `${f.photos.length} photo${f.photos.length === 1 ? "" : "s"}, one a page at the full size the page allows, never cropped.`,
    );
    let n = 0;
    for (const p of f.photos) {
      n++;
      const data = await ctx.photoBytes(p.id);
      // The first photo goes under the heading; each other one on a page of its own.
      if (n > 1) pdf.newPage();
      pdf.photoPage(data, p, [
        `Photo ${n} of ${f.photos.length}`,
        `Added ${when(p.addedAt)} by ${orDash(p.addedBy)}${p.workOrderId ? `, after work order ${p.workOrderId}` : ""}`,
        `${p.width} × ${p.height} px · SHA-256 ${p.sha256}`,
      ]);
    }
  },
  Readings: (pdf, f) => {
    const { rows, count } = f.readings;
    if (count === 0) {
      pdf.paragraph("No readings on this case.");
      return;
    }
    // Per room: the air's relative humidity, and where the surface temperature was measured, the
    // humidity at that surface (the room's vapour pressure over saturation at the surface, as the engine works it out).
    const series = new Map<string, { x: number; y: number }[]>();
    const add = (key: string, point: { x: number; y: number }) => {
      const points = series.get(key);
      if (points) points.push(point);
      else series.set(key, [point]);
    };
    for (const [at, room, airT, rh, surfaceT] of rows) {
      const x = Date.parse(at as string);
      add(`${room as string}, air`, { x, y: rh as number });
      if (surfaceT !== null) {
        const surfaceRh = surfaceRelativeHumidityPct(vapourPressurePa(airT as number, rh as number), surfaceT as number);
        add(`${room as string}, at the surface`, { x, y: Math.min(surfaceRh, 100) });
      }
    }
    pdf.paragraph(`${count} readings, from ${when(rows[0]![0] as string)} to ${when(rows[count - 1]![0] as string)}.`);
    pdf.lineChart({
      title: "Relative humidity, % (at the surface: capped at 100 %, where water condenses)",
      yLabel: "RH %",
      series: [...series].map(([label, points], i) => ({ label, colour: ROOM_COLOURS[i % ROOM_COLOURS.length]!, points })),
      thresholds: [{ y: 80, label: "80 % at a surface: mould can grow (BS EN ISO 13788)" }],
      formatX: (x) => when(new Date(x).toISOString()),
    });
    pdf.paragraph("Every reading is in facts.json, attached to this PDF.", { soft: true });
  },
  "The engine's evaluation": (pdf, f) => {
    const e = f.evaluation;
    pdf.paragraph(e.statement);
    for (const room of e.rooms) {
      pdf.subheading(
        `${room.room}: ${room.readingsCount} readings${room.evaluatedAt ? `, worked out ${when(room.evaluatedAt)}` : ""}`,
      );
      if (room.surfaces.length) {
        pdf.table(
          [
            { header: "Surface", width: 0.22 },
            { header: "State", width: 0.14 },
            { header: "Surface °C / RH %", width: 0.18 },
            { header: "Why", width: 0.46 },
          ],
          room.surfaces.map((s) => [
            s.element,
            words(s.result.surface.state),
            `${s.result.surface.temperatureC.toFixed(1)} / ${s.result.surface.relativeHumidityPct.toFixed(0)} (${s.result.surface.source})`,
            s.result.reasons.join(" "),
          ]),
        );
      }
      if (room.series) {
        const s = room.series;
        pdf.facts([
          ["Hours at surface RH of 80 % or more", s.hoursSurfaceRhAtLeast80.toFixed(1)],
          ["Hours condensing", s.hoursCondensing.toFixed(1)],
          [
            "Worst 30-day mean surface RH",
            s.worstRolling30DayMeanSurfaceRhPct === null ? "—" : `${s.worstRolling30DayMeanSurfaceRhPct.toFixed(1)} %`,
          ],
          [
            "Mould index (final / highest)",
            `${s.mouldIndex.final.toFixed(2)} / ${s.mouldIndex.max.toFixed(2)} (${words(s.mouldIndex.material)})`,
          ],
          ["What the readings point to", `${words(s.diagnosis.kind)}. ${s.diagnosis.reasons.join(" ")}`],
        ]);
      }
    }
    pdf.subheading("Sources");
    for (const source of e.sources) pdf.paragraph(`• ${source}`);
  },
  "HHSRS assessments": (pdf, f) => {
    if (f.assessments.length === 0) return pdf.paragraph("No HHSRS assessment recorded.");
    for (const a of f.assessments) {
      pdf.subheading(`Version ${a.version}, ${when(a.at)}, ${orDash(a.by)}`);
      pdf.facts([
        ["Likelihood", `1 in ${a.likelihood}`],
        ["Spread of harm (classes I–IV, %)", a.spread.join(" / ")],
        ["Score, band, category", `${a.score} · band ${a.band} · Category ${a.category}`],
        [`Justification (${INTERNAL})`, a.justification],
      ]);
    }
  },
  Inspections: (pdf, f) => {
    if (f.inspections.length === 0) return pdf.paragraph("No inspection recorded.");
    for (const i of f.inspections) {
      pdf.subheading(`${when(i.at)}, ${orDash(i.by)}`);
      pdf.facts([
        ["Cause", words(i.cause)],
        ["Mould", words(i.mouldExtent)],
        [`Findings (${INTERNAL})`, i.findings],
        ...i.rooms.map(
          (r) =>
            [
              r.room,
              [
                r.airTemperatureC === undefined ? null : `air ${r.airTemperatureC} °C`,
                r.relativeHumidityPct === undefined ? null : `RH ${r.relativeHumidityPct} %`,
                r.surfaceTemperaturesC?.length ? `surfaces ${r.surfaceTemperaturesC.join(", ")} °C` : null,
                r.moisture ? `moisture ${r.moisture.value} ${r.moisture.unit === "pct" ? "%" : "WME"}` : null,
                r.note ? `note (${INTERNAL}): ${r.note}` : null,
              ]
                .filter(Boolean)
                .join("; ") || "—",
            ] as const,
        ),
      ]);
    }
  },
  "Letters and the written summary": (pdf, f) => {
    if (f.letters.length === 0) return pdf.paragraph("No letter or written summary sent.");
    for (const l of f.letters) {
      pdf.subheading(`Written summary, ${when(l.at)}, ${orDash(l.by)} (e-mail: ${words(l.delivery)})`);
      pdf.paragraph(l.body);
    }
  },
  "Messages and internal notes": (pdf, f) => {
    if (f.messages.length === 0) return pdf.paragraph("No messages or notes.");
    for (const m of f.messages) {
      const read = m.readBy.length ? ` Read by ${m.readBy.map((r) => `${r.name} ${when(r.at)}`).join(", ")}.` : "";
      pdf.paragraph(`${m.body}${m.photoIds.length ? ` [photos ${m.photoIds.join(", ")}]` : ""}${read}`, {
        label: `${MESSAGE_WORDS[m.kind] ?? m.kind} · ${when(m.at)} · ${orDash(m.by)}`,
      });
    }
  },
  "E-mails and their delivery": (pdf, f) => {
    if (f.emails.length === 0) return pdf.paragraph("No e-mails about this case.");
    pdf.table(
      [
        { header: "Queued", width: 0.2 },
        { header: "To", width: 0.28 },
        { header: "Which", width: 0.2 },
        { header: "Delivery", width: 0.32 },
      ],
      f.emails.map((e) => [
        when(e.at),
        e.to,
        `${words(e.template)}${e.resent ? ` (sent again by ${orDash(e.by)})` : ""}`,
        `${words(e.status)}${e.sentAt ? ` ${when(e.sentAt)}` : ""}${e.attempts ? `, ${e.attempts} attempt${e.attempts === 1 ? "" : "s"}` : ""}${e.error ? `: ${e.error}` : ""}`,
      ]),
    );
  },
  Deadlines: (pdf, f) => {
    pdf.paragraph(`As of ${when(f.deadlinesAsOf)}.`, { soft: true });
    pdf.table(
      [
        { header: "Stage", width: 0.26 },
        { header: "Due", width: 0.26 },
        { header: "Done", width: 0.26 },
        { header: "Met or missed", width: 0.22 },
      ],
      f.deadlines.map((d) => [STAGE_WORDS[d.stage] ?? d.stage, when(d.dueAt), when(d.doneAt), STATE_WORDS[d.state] ?? d.state]),
    );
  },
  Works: (pdf, f) => {
    if (f.works.length === 0) return pdf.paragraph("No work ordered.");
    for (const w of f.works) {
      pdf.subheading(`Work order ${w.id}: ${words(w.type)} (${words(w.status)})`);
      pdf.facts([
        ["Raised", `${when(w.raisedAt)} by ${orDash(w.raisedBy)}; ${words(w.priority)} priority, target ${day(w.targetDate)}`],
        ["Rooms", list(w.rooms)],
        [`Description for the operative (${INTERNAL})`, w.description],
        ...w.bookings.map(
          (b, i) =>
            [
              `Booking ${i + 1}`,
              `${day(b.date)} ${words(b.window)}, ${orDash(b.operative ?? b.contractor)} (${words(b.state)}${b.tenantResponse ? `; household: ${words(b.tenantResponse)}${b.tenantReason ? `, “${b.tenantReason}”` : ""}` : ""})`,
            ] as const,
        ),
        ["Done", w.completedAt ? `${day(w.doneOn ?? w.completedAt)}, recorded by ${orDash(w.completedBy)}` : "—"],
        ...(w.earlyReason ? ([[`Done before the booked day (${INTERNAL})`, w.earlyReason]] as const) : []),
        ["Completion note", orDash(w.completionNote)],
        [`Materials (${INTERNAL})`, orDash(w.materials)],
        ["Minutes on site", orDash(w.minutesOnSite)],
        [`Follow-on work found (${INTERNAL})`, orDash(w.followOn)],
      ]);
    }
  },
  "Verification of the works": (pdf, f) => {
    const v = f.verification;
    pdf.facts([
      ["State", words(v.state)],
      ["Works done", when(v.worksDoneAt)],
      ["Monitoring until", `${when(v.monitoringEndsAt)} (${v.monitoringDays} days)`],
      [
        "Verdict",
        v.outcome
          ? `${v.outcome.effective ? "Fix effective" : "Fix not effective"}, ${when(v.outcome.at)} by ${orDash(v.outcome.by)}: ${v.outcome.note}`
          : "Not decided",
      ],
      ...(v.outcome?.override ? ([[`Recorded without enough readings (${INTERNAL})`, v.outcome.override]] as const) : []),
    ]);
    if (v.rooms.length) {
      pdf.table(
        [
          { header: "Room", width: 0.25 },
          { header: "Hours a day at 80 % or more, before the works", width: 0.25 },
          { header: "After the works", width: 0.25 },
          { header: "Improved", width: 0.25 },
        ],
        v.rooms.map((r) => [
          r.room,
          orDash(r.before.hoursAtLeast80PerDay?.toFixed(1)),
          orDash(r.after.hoursAtLeast80PerDay?.toFixed(1)),
          r.improved === null ? "Not enough readings" : r.improved ? "Yes" : "No",
        ]),
      );
    }
  },
  Complaints: (pdf) => complaintsSection(pdf),
  Timeline: (pdf, f) => {
    pdf.table(
      [
        { header: "When", width: 0.3 },
        { header: "What", width: 0.4 },
        { header: "Who", width: 0.3 },
      ],
      f.timeline.map((t) => [when(t.at), words(t.type), orDash(t.by)]),
    );
  },
  "About this pack": (pdf, _f, ctx) => {
    pdf.paragraph(ctx.sha256, { label: "Content SHA-256" });
    for (const line of EVIDENCE_PACK_DEFINITION.text) pdf.paragraph(line);
    pdf.paragraph(`Definition: ${EVIDENCE_PACK_DEFINITION.id}.`, { soft: true });
  },
};

/**
 * Complaints about the case. Complaints are not recorded yet: this is the one place that will ask
 * the complaints service for them when it exists.
 */
export function complaintsSection(pdf: PdfWriter): void {
  pdf.paragraph("No complaint has been raised about this case.");
}

/** Sections that start on a new page: the photos (one a page), and what follows them. */
const STARTS_A_PAGE: ReadonlySet<Heading> = new Set<Heading>(["Photos", "Readings"]);

/** Writes every section of the pack, in order. */
export async function renderEvidencePack(pdf: PdfWriter, facts: PackFacts, ctx: PackContext): Promise<void> {
  cover(pdf, facts, ctx);
  for (const heading of SECTION_HEADINGS) {
    if (STARTS_A_PAGE.has(heading)) pdf.newPage();
    pdf.heading(heading);
    await sections[heading](pdf, facts, ctx);
  }
}
