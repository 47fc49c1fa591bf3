import {
  BUILDING_ELEMENTS,
  elementsForReport,
  evaluatePoint,
  evaluateSeries,
  type ElementId,
  type PointResult,
  type SeriesResult,
  type SurfaceState,
  SURFACE_STATES,
} from "../../../src/lib/domain/index.js";
import { surfaceHumidity } from "../../../src/lib/domain/wording.js";
import type { Actor } from "../auth/actor.js";
import type { Case, CaseService } from "../cases/case.service.js";
import type { ReadingService } from "../readings/reading.service.js";

export const INVESTIGATION_STATEMENT =
  "Your landlord will look into this report whatever the readings show: readings help us understand the cause, they never decide whether damp or mould is taken seriously.";

export interface SurfaceEvaluation {
  element: ElementId;
  label: string;
  result: PointResult;
}

export interface RoomEvaluation {
  roomId: number;
  roomName: string;
  readingsCount: number;
  latest: {
    takenAt: string;
    airTemperatureC: number;
    relativeHumidityPct: number;
    surfaceTemperatureC: number | null;
    outdoorTemperatureC: number | null;
  } | null;
  surfaces: SurfaceEvaluation[];
  series: SeriesResult | null;
}

const RISKY = new Set(["condensing", "mould-risk"]);
const labelOf = (id: ElementId) => BUILDING_ELEMENTS.find((e) => e.id === id)?.label ?? id;

/** The risk engine over a case's readings, room by room and surface by surface. */
export class EvaluationService {
  constructor(
    private readonly cases: CaseService,
    private readonly readings: ReadingService,
  ) {}

  async forCase(actor: Actor, caseId: number): Promise<{ statement: string; rooms: RoomEvaluation[] }> {
    const c = await this.cases.getForActor(actor, caseId);
    return { statement: INVESTIGATION_STATEMENT, rooms: await this.evaluate(c) };
  }

  /** The worst surface state and the highest current mould index over the case's rooms; nulls while there are no readings. */
  async riskOf(c: Case): Promise<{ state: SurfaceState | null; mouldIndex: number | null }> {
    const rooms = await this.evaluate(c);
    let state: SurfaceState | null = null;
    let mouldIndex: number | null = null;
    for (const room of rooms) {
      for (const s of room.surfaces) {
        if (state === null || SURFACE_STATES.indexOf(s.result.surface.state) > SURFACE_STATES.indexOf(state))
          state = s.result.surface.state;
      }
      if (room.series) mouldIndex = Math.max(mouldIndex ?? 0, room.series.mouldIndex.final);
    }
    return { state, mouldIndex };
  }

  private async evaluate(c: Case): Promise<RoomEvaluation[]> {
    const property = c.property!;
    const elements = elementsForReport(property, c.locations);
    const surfaceWet = c.observations.includes("wet-patches") || c.observations.includes("leak");
    const out: RoomEvaluation[] = [];
    for (const room of this.cases.roomsOf(c)) {
      const series = await this.readings.seriesFor(c.id, room.id);
      if (series.length === 0) continue;
      const last = series[series.length - 1]!;
      const surfaces = elements.map((element, i) => ({
        element,
        label: i === 0 && last.surfaceTemperatureC !== undefined ? `${labelOf(element)} (measured surface)` : labelOf(element),
        result: evaluatePoint({
          airTemperatureC: last.airTemperatureC,
          relativeHumidityPct: last.relativeHumidityPct,
          // A surface thermometer reading belongs to the surface the report is mainly about.
          surfaceTemperatureC: i === 0 ? last.surfaceTemperatureC : undefined,
          outdoorTemperatureC: last.outdoorTemperatureC,
          element,
        }),
      }));
      out.push({
        roomId: room.id,
        roomName: room.name,
        readingsCount: series.length,
        latest: {
          takenAt: new Date(last.at).toISOString(),
          airTemperatureC: last.airTemperatureC,
          relativeHumidityPct: last.relativeHumidityPct,
          surfaceTemperatureC: last.surfaceTemperatureC ?? null,
          outdoorTemperatureC: last.outdoorTemperatureC ?? null,
        },
        surfaces,
        series: evaluateSeries({ readings: series, element: elements[0], surfaceWet }),
      });
    }
    return out;
  }

  /** After new readings: tell the officers (once per case) when a surface is condensing or at mould risk. */
  async alertIfRisky(actor: Actor, caseId: number): Promise<void> {
    const c = await this.cases.getForActor(actor, caseId);
    if (c.officersAlertedAt) return;
    const rooms = await this.evaluate(c);
    const reasons = rooms.flatMap((r) =>
      r.surfaces
        .filter((s) => RISKY.has(s.result.surface.state))
        .map(
          (s) =>
            `${r.roomName}, ${s.label.toLowerCase()}: ${s.result.surface.state === "condensing" ? "water condensing" : "at mould-growth risk"} (surface humidity ${surfaceHumidity(s.result.surface.relativeHumidityPct)}).`,
        ),
    );
    if (reasons.length) await this.cases.alertOfficersNow(c, reasons);
  }
}
