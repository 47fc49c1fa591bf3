import { fetchWeatherApi } from "openmeteo";
import { Between, type DataSource } from "typeorm";
import type { Actor } from "../../lib/actor.js";
import type { Clock } from "../../lib/clock.js";
import { ValidationError } from "../../lib/errors.js";
import type { Logger } from "../../lib/logger.js";
import type { PropertyService } from "../properties/property.service.js";
import { EstateLocation } from "./estate-location.entity.js";
import { WeatherHour } from "./weather-hour.entity.js";

/** An estate of the landlord and where it is (nulls: not set). */
export interface EstateLocationView {
  estate: string;
  latitude: number | null;
  longitude: number | null;
  updatedAt: Date | null;
}

/** One hour of outdoor air at a home (the hour starting at `at`, UTC). */
export interface OutdoorHour {
  at: Date;
  temperatureC: number;
  relativeHumidityPct: number;
}

/** Where a home's weather is taken from: its own coordinates, else its estate's. */
export interface WeatherPlace {
  source: "home" | "estate";
  latitude: number;
  longitude: number;
}

export interface WeatherSettings {
  /** The forecast endpoint (WEATHER_URL). */
  url: string;
  timeoutMs: number;
  /** A stored hour that was still a forecast when fetched is fetched again once it is this old. */
  forecastMaxAgeMs: number;
}

const HOUR_MS = 3_600_000;
const DAY_MS = 86_400_000;
/** The most days asked for in one call (the hosted API gives at most 92 past days per call). */
const DAYS_PER_CALL = 92;

const tenths = (degrees: number) => Math.round(degrees * 10);
const dayText = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/**
 * Outdoor temperature and humidity for homes, from the weather API through the `openmeteo` client.
 * Hours are stored per 0.1° cell (`weather_hours`), so a repeated read asks the API nothing; an hour
 * that was a forecast when fetched is fetched again once older than `forecastMaxAgeMs`. When the API
 * fails, the failure is logged and what is stored is returned.
 */
export class WeatherService {
  constructor(
    private readonly dataSource: DataSource,
    private readonly properties: PropertyService,
    private readonly settings: WeatherSettings,
    private readonly clock: Clock,
    private readonly logger?: Logger,
  ) {}

  /** Staff: every estate of the actor's landlord (from its homes), with its coordinates where set. */
  async estateLocations(actor: Actor): Promise<EstateLocationView[]> {
    const [estates, set] = await Promise.all([
      this.properties.estates(actor),
      this.dataSource.getRepository(EstateLocation).findBy({ organisationId: actor.organisationId }),
    ]);
    const byName = new Map(set.map((l) => [l.estate, l]));
    return estates.map((estate) => {
      const l = byName.get(estate);
      return { estate, latitude: l?.latitude ?? null, longitude: l?.longitude ?? null, updatedAt: l?.updatedAt ?? null };
    });
  }

  /** Admin: where one of the landlord's estates is (its homes without coordinates take their weather there). */
  async setEstateLocation(
    actor: Actor,
    input: { estate: string; latitude: number; longitude: number },
  ): Promise<EstateLocationView> {
    const estates = await this.properties.estates(actor);
    if (!estates.includes(input.estate)) {
      throw new ValidationError("None of your homes is on this estate.", [
        { field: "estate", message: "Choose an estate that one of your homes is on." },
      ]);
    }
    const row = { organisationId: actor.organisationId, ...input, updatedAt: this.clock.now() };
    await this.dataSource.getRepository(EstateLocation).upsert(row, ["organisationId", "estate"]);
    this.logger?.info(
      { audit: "estate-location-set", actorId: actor.id, organisationId: actor.organisationId, estate: input.estate },
      "audit: estate-location-set",
    );
    return { estate: input.estate, latitude: input.latitude, longitude: input.longitude, updatedAt: row.updatedAt };
  }

  /** The home's weather location, or null when neither the home nor its estate has coordinates. */
  async placeOf(propertyId: number): Promise<WeatherPlace | null> {
    const home = await this.properties.placeOf(propertyId);
    if (!home) return null;
    if (home.latitude !== null && home.longitude !== null) {
      return { source: "home", latitude: home.latitude, longitude: home.longitude };
    }
    const estate = await this.dataSource
      .getRepository(EstateLocation)
      .findOneBy({ organisationId: home.organisationId, estate: home.estate });
    return estate ? { source: "estate", latitude: estate.latitude, longitude: estate.longitude } : null;
  }

  /**
   * Each whole hour from `from` (rounded down) to `to`, history and forecast alike; empty when the home
   * has no location (the caller says so). Hours the API could not give are missing from the list.
   */
  async outdoorHourly(propertyId: number, from: Date, to: Date): Promise<OutdoorHour[]> {
    return (await this.outdoor(propertyId, from, to)).hours;
  }

  /** As outdoorHourly, with where the weather was taken (null: the home has no location). */
  async outdoor(propertyId: number, from: Date, to: Date): Promise<{ place: WeatherPlace | null; hours: OutdoorHour[] }> {
    const place = await this.placeOf(propertyId);
    if (!place) return { place: null, hours: [] };
    return { place, hours: await this.hoursAt(place.latitude, place.longitude, from, to) };
  }

  /** The stored hours of the 0.1° cell holding (latitude, longitude), fetching the missing or stale ones first. */
  async hoursAt(latitude: number, longitude: number, from: Date, to: Date): Promise<OutdoorHour[]> {
    const cell = { latTenths: tenths(latitude), lonTenths: tenths(longitude) };
    const firstMs = Math.floor(from.getTime() / HOUR_MS) * HOUR_MS;
    const lastMs = Math.floor(to.getTime() / HOUR_MS) * HOUR_MS;
    if (lastMs < firstMs) return [];
    let stored = await this.stored(cell, firstMs, lastMs);
    const due = this.dueHours(stored, firstMs, lastMs);
    if (due.length) {
      try {
        await this.fetchAndStore(cell, due[0]!, due.at(-1)!);
        stored = await this.stored(cell, firstMs, lastMs);
      } catch (error) {
        this.logger?.warn(
          {
            err: error,
            latTenths: cell.latTenths,
            lonTenths: cell.lonTenths,
            from: new Date(due[0]!),
            to: new Date(due.at(-1)!),
          },
          "weather: the forecast API failed; using the stored hours",
        );
      }
    }
    return stored.map((h) => ({ at: h.hourAt, temperatureC: h.temperatureC, relativeHumidityPct: h.relativeHumidityPct }));
  }

  private stored(cell: { latTenths: number; lonTenths: number }, firstMs: number, lastMs: number) {
    return this.dataSource.getRepository(WeatherHour).find({
      where: { ...cell, hourAt: Between(new Date(firstMs), new Date(lastMs)) },
      order: { hourAt: "ASC" },
    });
  }

  /** The hours (ms) not stored, or stored while still a forecast and now older than the limit. */
  private dueHours(stored: WeatherHour[], firstMs: number, lastMs: number): number[] {
    const nowMs = this.clock.now().getTime();
    const byHour = new Map(stored.map((h) => [h.hourAt.getTime(), h]));
    const due: number[] = [];
    for (let t = firstMs; t <= lastMs; t += HOUR_MS) {
      const h = byHour.get(t);
      const wasForecast = h !== undefined && t + HOUR_MS > h.fetchedAt.getTime();
      if (!h || (wasForecast && nowMs - h.fetchedAt.getTime() > this.settings.forecastMaxAgeMs)) due.push(t);
    }
    return due;
  }

  /** Asks the API for whole UTC days covering firstMs…lastMs, at most DAYS_PER_CALL a call, and upserts every hour. */
  private async fetchAndStore(cell: { latTenths: number; lonTenths: number }, firstMs: number, lastMs: number) {
    const firstDay = Math.floor(firstMs / DAY_MS) * DAY_MS;
    const lastDay = Math.floor(lastMs / DAY_MS) * DAY_MS;
    for (let start = firstDay; start <= lastDay; start += DAYS_PER_CALL * DAY_MS) {
      const end = Math.min(lastDay, start + (DAYS_PER_CALL - 1) * DAY_MS);
      const fetchedAt = this.clock.now();
      const [response] = await fetchWeatherApi(
        this.settings.url,
        {
          latitude: cell.latTenths / 10,
          longitude: cell.lonTenths / 10,
          hourly: ["temperature_2m", "relative_humidity_2m"],
          start_date: dayText(start),
          end_date: dayText(end),
          timezone: "GMT",
        },
        2,
        0.2,
        1,
        { signal: AbortSignal.timeout(this.settings.timeoutMs) },
      );
      const hourly = response?.hourly();
      const temperature = hourly?.variables(0)?.valuesArray();
      const humidity = hourly?.variables(1)?.valuesArray();
      if (!hourly || !temperature || !humidity) throw new Error("weather: the answer has no hourly temperature and humidity");
      const startS = Number(hourly.time());
      const intervalS = hourly.interval();
      if (intervalS !== 3600) throw new Error(`weather: hourly values came every ${intervalS} s`);
      const rows: Partial<WeatherHour>[] = [];
      for (let i = 0; i < temperature.length && i < humidity.length; i++) {
        const t = temperature[i]!;
        const rh = humidity[i]!;
        // NaN marks an hour the service has no value for: it stays missing (and is asked for again).
        if (!Number.isFinite(t) || !Number.isFinite(rh)) continue;
        rows.push({
          ...cell,
          hourAt: new Date((startS + i * intervalS) * 1000),
          temperatureC: Math.round(t * 10) / 10,
          relativeHumidityPct: Math.round(Math.min(100, Math.max(0, rh)) * 10) / 10,
          fetchedAt,
        });
      }
      for (let i = 0; i < rows.length; i += 1000) {
        await this.dataSource
          .createQueryBuilder()
          .insert()
          .into(WeatherHour)
          .values(rows.slice(i, i + 1000))
          .orUpdate(["temperature_c", "relative_humidity_pct", "fetched_at"], ["lat_tenths", "lon_tenths", "hour_at"])
          .execute();
      }
    }
  }
}
