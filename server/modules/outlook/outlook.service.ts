// The three-day condensation outlook of a home, for its tenant and for its landlord's staff. It reads
// the home (properties), the tenancy (tenancies), the rooms' latest readings (readings, and sensors
// when wired) and the forecast (weather); the figures are the pure domain's (condensation-outlook.ts).
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import type { Logger } from "../../lib/logger.js";
import { DEFAULT_TIME_ZONE } from "../../../src/lib/domain/time-zone.js";
import {
  OUTLOOK_CAUTIONS,
  OUTLOOK_METHOD,
  assumedIndoorConditions,
  coldestSurface,
  outlookDates,
  outlookTips,
  outlookWindow,
  roomOutlook,
  type IndoorConditions,
  type OutdoorForecastHour,
  type OutlookAdvice,
  type OutlookLine,
  type RoomOutlook,
} from "../../../src/lib/domain/condensation-outlook.js";
import { getBuildingElement, type BuildingElement } from "../../../src/lib/domain/surface.js";
import { wallElement } from "../../../src/lib/domain/home-elements.js";
import type { Property, PropertyService, Room } from "../properties/property.service.js";
import type { ReadingService } from "../readings/reading.service.js";
import type { TenancyService } from "../tenancies/tenancy.service.js";
import type { WeatherService } from "../weather/weather.service.js";

/** The forecast hours of a home: WeatherService.outdoorHourly (empty when the home has no location). */
type OutdoorHours = Pick<WeatherService, "outdoorHourly">;

/**
 * Each room's recent air conditions from its sensors (the sensors module gives it): ideally the mean of
 * the readings since `since`, keyed by room id; rooms without readings left out.
 */
export interface RoomSensorConditions {
  recentByRoom(
    propertyId: number,
    since: Date,
  ): Promise<Map<number, { takenAt: Date; airTemperatureC: number; relativeHumidityPct: number }>>;
}

/** Ours: sensor figures count when taken within the last day, a case's readings within the last 14 days. */
export const SENSOR_RECENT_MS = 24 * 3_600_000;
export const CASE_READINGS_RECENT_MS = 14 * 86_400_000;

export interface HomeOutlook {
  property: Property;
  generatedAt: Date;
  timeZone: string;
  dates: string[];
  forecastAvailable: boolean;
  surface: BuildingElement;
  rooms: { room: Room; indoor: IndoorConditions; outlook: RoomOutlook }[];
  tips: OutlookAdvice[];
  cautions: readonly OutlookAdvice[];
  method: readonly OutlookLine[];
}

export class OutlookService {
  private sensors: RoomSensorConditions | null = null;

  constructor(
    private readonly properties: PropertyService,
    private readonly tenancies: TenancyService,
    private readonly readings: ReadingService,
    private readonly weather: OutdoorHours,
    private readonly clock: Clock,
    private readonly logger: Logger,
  ) {}

  /** Rooms' sensor figures, once the sensors module is there (until then: case readings, then our assumption). */
  useSensorConditions(sensors: RoomSensorConditions): void {
    this.sensors = sensors;
  }

  /** The outlook of the tenant's current home (404 without a current tenancy). */
  async forTenant(actor: Actor): Promise<HomeOutlook> {
    const { property } = await this.tenancies.homeOf(actor);
    return this.build(property);
  }

  /** The outlook of a home of the actor's landlord (404 for another landlord's home). */
  async forStaff(actor: Actor, propertyId: number): Promise<HomeOutlook> {
    return this.build(await this.properties.getForStaff(actor, propertyId));
  }

  private async build(property: Property): Promise<HomeOutlook> {
    const now = this.clock.now();
    const timeZone = DEFAULT_TIME_ZONE;
    const { from, to } = outlookWindow(now, timeZone);
    const [forecast, sensorByRoom, caseByRoom] = await Promise.all([
      this.forecast(property.id, from, to),
      this.sensors ? this.sensors.recentByRoom(property.id, new Date(now.getTime() - SENSOR_RECENT_MS)) : new Map(),
      this.readings.latestByRoom(property.id, 1),
    ]);
    const caseLatest = new Map(caseByRoom.map((r) => [r.roomId, r.latest[0]]));
    const surface = coldestSurface(property);
    const wall = getBuildingElement(wallElement(property.wallType));
    const rooms = (property.rooms ?? [])
      .slice()
      .sort((a, b) => a.id - b.id)
      .map((room) => {
        const indoor = this.indoorOf(room.id, now, sensorByRoom, caseLatest);
        return { room, indoor, outlook: roomOutlook({ now, timeZone, forecast, indoor, fRsi: surface.fRsi }) };
      });
    const forecastAvailable = rooms.length === 0 ? forecast.length > 0 : rooms.some((r) => r.outlook.hours.length > 0);
    return {
      property,
      generatedAt: now,
      timeZone,
      dates: outlookDates(now, timeZone),
      forecastAvailable,
      surface,
      rooms,
      tips: outlookTips({ days: rooms.flatMap((r) => r.outlook.days), surface, wall, forecast: forecastAvailable }),
      cautions: OUTLOOK_CAUTIONS,
      method: OUTLOOK_METHOD,
    };
  }

  private indoorOf(
    roomId: number,
    now: Date,
    sensorByRoom: Map<number, { takenAt: Date; airTemperatureC: number; relativeHumidityPct: number }>,
    caseLatest: Map<number, { takenAt: Date; airTemperatureC: number; relativeHumidityPct: number } | undefined>,
  ): IndoorConditions {
    const sensor = sensorByRoom.get(roomId);
    if (sensor && now.getTime() - sensor.takenAt.getTime() <= SENSOR_RECENT_MS) {
      return { ...pick(sensor), source: "sensor", takenAt: sensor.takenAt };
    }
    const reading = caseLatest.get(roomId);
    if (reading && now.getTime() - reading.takenAt.getTime() <= CASE_READINGS_RECENT_MS) {
      return { ...pick(reading), source: "case-readings", takenAt: reading.takenAt };
    }
    return assumedIndoorConditions(now);
  }

  /** The forecast hours; a failing weather service means no forecast, not a failing page. */
  private async forecast(propertyId: number, from: Date, to: Date): Promise<OutdoorForecastHour[]> {
    try {
      return await this.weather.outdoorHourly(propertyId, from, to);
    } catch (error) {
      this.logger.warn({ err: error, propertyId }, "no forecast for the condensation outlook");
      return [];
    }
  }
}

function pick(r: { airTemperatureC: number; relativeHumidityPct: number }) {
  return { airTemperatureC: r.airTemperatureC, relativeHumidityPct: r.relativeHumidityPct };
}
