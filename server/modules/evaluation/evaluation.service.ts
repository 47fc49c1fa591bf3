import {
  BUILDING_ELEMENTS,
  elementsForReport,
  evaluatePoint,
  type ElementId,
  type PointResult,
  type SeriesResult,
  type SurfaceState,
  SURFACE_STATES,
} from "../../../src/lib/domain/index.js";
import { surfaceHumidity } from "../../../src/lib/domain/wording.js";
import { isStaff, type Actor } from "../auth/actor.js";
import type { Case, CaseService } from "../cases/case.service.js";
import type { EvaluationParams, ReadingService, StoredRoomEvaluation } from "../readings/reading.service.js";
import type { WeatherPlace, WeatherService } from "../weather/weather.service.js";

export const INVESTIGATION_STATEMENT =
  "Your landlord will look into this report whatever the readings show: readings help us understand the cause, they never decide whether damp or mould is taken seriously.";

/** The published methods the engine's figures come from (src/lib/domain), named wherever its results are reported. */
export const ENGINE_SOURCES: readonly string[] = [
  "Moist-air properties (dew point, vapour pressure, humidity): ASHRAE Handbook, Fundamentals 2017, chapter 1, through psychrolib.",
  "Surface humidity, the 80 % limit for mould and the temperature factor fRsi: BS EN ISO 13788.",
  "Mould growth index: the VTT model, Hukka & Viitanen (1999), with the sensitivity classes of Ojanen et al. (2010).",
  "Internal moisture excess and load classes: BS EN ISO 13788.",
  "Outdoor temperature and humidity where a reading has none: the weather service's hourly values at the home's (or its estate's) coordinates.",
];

/** Staff only: where the outdoor values behind a room's estimates came from. */
export interface OutdoorSource {
  /** Readings that took their outdoor temperature and humidity from the weather service. */
  fromWeather: number;
  /** Whose coordinates the weather is for; null when neither the home nor its estate has any. */
  place: "home" | "estate" | null;
  note: string;
}

export interface SurfaceEvaluation {
  element: ElementId;
  label: string;
  result: PointResult;
}

export interface RoomEvaluation {
  roomId: number;
  roomName: string;
  readingsCount: number;
  latest: StoredRoomEvaluation["latest"];
  surfaces: SurfaceEvaluation[];
  series: SeriesResult | null;
  /** True while newer readings are being taken in: the figures are the last stored ones. */
  updating: boolean;
  /** When these figures were worked out. */
  evaluatedAt: string | null;
  /** Staff only (absent for tenants). */
  outdoor?: OutdoorSource | null;
}

const withoutWeatherMark = ({ outdoorFromWeather: _, ...latest }: NonNullable<StoredRoomEvaluation["latest"]>) => latest;

const RISKY = new Set(["condensing", "mould-risk"]);
const labelOf = (id: ElementId) => BUILDING_ELEMENTS.find((e) => e.id === id)?.label ?? id;

/** The risk engine over a case's readings, room by room and surface by surface. */
export class EvaluationService {
  constructor(
    private readonly cases: CaseService,
    private readonly readings: ReadingService,
    private readonly weather?: Pick<WeatherService, "placeOf">,
  ) {}

  async forCase(actor: Actor, caseId: number): Promise<{ statement: string; updating: boolean; rooms: RoomEvaluation[] }> {
    const c = await this.cases.getForActor(actor, caseId);
    const { rooms, updating } = await this.evaluate(c);
    // Where the outdoor values came from is for staff; a tenant's reply has no such field.
    if (!isStaff(actor)) for (const room of rooms) delete room.outdoor;
    return { statement: INVESTIGATION_STATEMENT, updating, rooms };
  }

  /**
   * The worst surface state and the highest current mould index over the case's rooms; nulls while
   * there are no readings. From the stored evaluations, as forCase: a room being worked out again is
   * not waited for (its case's triage figures are marked due again once its newer result is stored).
   */
  async riskOf(c: Case): Promise<{ state: SurfaceState | null; mouldIndex: number | null }> {
    const { rooms } = await this.evaluate(c);
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

  /** The element, wetness and weather place a case's rooms are evaluated for. */
  private async paramsOf(c: Case): Promise<{ elements: ElementId[]; params: EvaluationParams; place: WeatherPlace | null }> {
    const elements = elementsForReport(c.property!, c.locations);
    const surfaceWet = c.observations.includes("wet-patches") || c.observations.includes("leak");
    const place = (await this.weather?.placeOf(c.propertyId)) ?? null;
    // The weather is asked for at the centre of the place's 0.1° cell, as it is stored.
    const weather = place
      ? { latitude: Math.round(place.latitude * 10) / 10, longitude: Math.round(place.longitude * 10) / 10 }
      : undefined;
    return { elements, params: { element: elements[0], surfaceWet, weather }, place };
  }

  private outdoorSource(e: StoredRoomEvaluation, place: WeatherPlace | null): OutdoorSource | null {
    const fromWeather = e.outdoorFromWeather ?? 0;
    if (fromWeather > 0 && place) {
      const whose = place.source === "home" ? "the home's" : "its estate's";
      return {
        fromWeather,
        place: place.source,
        note:
          `Outdoor temperature and humidity for ${fromWeather} of ${e.readingsCount} readings come from the weather service ` +
          `(hourly values at ${whose} coordinates), as they carry no outdoor reading.`,
      };
    }
    if (!place && e.latest?.outdoorTemperatureC === null) {
      return {
        fromWeather: 0,
        place: null,
        note: "No outdoor readings, and no coordinates for this home or its estate: add them to estimate surface temperatures and the moisture excess from the weather.",
      };
    }
    return null;
  }

  /** The surfaces of a room judged at its latest reading (cheap: one reading, no series). */
  private surfacesAt(elements: ElementId[], last: StoredRoomEvaluation["latest"] & object): SurfaceEvaluation[] {
    return elements.map((element, i) => ({
      element,
      label: i === 0 && last.surfaceTemperatureC !== null ? `${labelOf(element)} (measured surface)` : labelOf(element),
      result: evaluatePoint({
        airTemperatureC: last.airTemperatureC,
        relativeHumidityPct: last.relativeHumidityPct,
        // A surface thermometer reading belongs to the surface the report is mainly about.
        surfaceTemperatureC: i === 0 ? (last.surfaceTemperatureC ?? undefined) : undefined,
        outdoorTemperatureC: last.outdoorTemperatureC ?? undefined,
        element,
      }),
    }));
  }

  /**
   * Each room from its stored evaluation (ReadingService.roomEvaluations): a room whose readings
   * changed since is answered from its last stored result, marked `updating`, while it is worked out
   * again on the worker pool in the background, so a big case never holds the request up.
   */
  private async evaluate(c: Case): Promise<{ rooms: RoomEvaluation[]; updating: boolean }> {
    const { elements, params, place } = await this.paramsOf(c);
    const rooms = this.cases.roomsOf(c);
    const stored = await this.readings.roomEvaluations(
      c.id,
      rooms.map((r) => r.id),
      params,
    );
    const out: RoomEvaluation[] = [];
    for (const room of rooms) {
      const state = stored.get(room.id);
      const e = state?.evaluation;
      if (!state || !e?.latest || e.readingsCount === 0) continue;
      out.push({
        roomId: room.id,
        roomName: room.name,
        readingsCount: e.readingsCount,
        // Where the outdoor values came from is told by `outdoor` (staff only), not inside the reading.
        latest: withoutWeatherMark(e.latest),
        surfaces: this.surfacesAt(elements, e.latest),
        series: e.series,
        updating: state.updating,
        evaluatedAt: state.evaluatedAt?.toISOString() ?? null,
        outdoor: this.outdoorSource(e, place),
      });
    }
    return { rooms: out, updating: [...stored.values()].some((s) => s.updating) };
  }

  /** After new readings: tell the officers (once per case) when a surface is condensing or at mould risk. */
  async alertIfRisky(actor: Actor, caseId: number): Promise<void> {
    const c = await this.cases.getForActor(actor, caseId);
    const { elements, params } = await this.paramsOf(c);
    const rooms = this.cases.roomsOf(c);
    // The stored series are brought up to date off the request thread; the alert needs only the latest readings.
    this.readings.refreshInBackground(
      c.id,
      rooms.map((r) => r.id),
      params,
    );
    if (c.officersAlertedAt) return;
    const latest = await this.readings.latestPerRoom(
      c.id,
      rooms.map((r) => r.id),
    );
    const judged = rooms.flatMap((room) => {
      const last = latest.get(room.id);
      if (!last) return [];
      const view = {
        takenAt: last.at.toISOString(),
        airTemperatureC: last.airTemperatureC,
        relativeHumidityPct: last.relativeHumidityPct,
        surfaceTemperatureC: last.surfaceTemperatureC ?? null,
        outdoorTemperatureC: last.outdoorTemperatureC ?? null,
      };
      return [{ roomName: room.name, surfaces: this.surfacesAt(elements, view) }];
    });
    const reasons = judged.flatMap((r) =>
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
