import type { z } from "zod";
import type { homeAtRiskResponse } from "../../../src/lib/contracts/sensor-watch.js";
import { addressOf } from "../cases/case.service.js";
import type { HomeAtRisk } from "./sensor-watch.service.js";

const round = (x: number, places: number) => Math.round(x * 10 ** places) / 10 ** places;

export function toHomeAtRiskDto(h: HomeAtRisk): z.input<typeof homeAtRiskResponse> {
  const newest = h.alerts.reduce((a, b) => (b.raisedAt.getTime() >= a.raisedAt.getTime() ? b : a));
  return {
    propertyId: h.property.id,
    address: addressOf(h.property),
    estate: h.property.estate,
    alertId: newest.id,
    firstRaisedAt: h.alerts[0].raisedAt.toISOString(),
    alerts: h.alerts.map((a) => ({
      id: a.id,
      roomId: a.roomId,
      rule: a.rule,
      raisedAt: a.raisedAt.toISOString(),
      figures: {
        hoursAt80: round(a.figures.hoursAt80, 1),
        hoursCondensing: round(a.figures.hoursCondensing, 1),
        condensingDays: a.figures.condensingDays,
        mouldIndex: round(a.figures.mouldIndex, 2),
      },
    })),
    rooms: h.rooms.map((r) => ({
      roomId: r.roomId,
      roomName: r.roomName,
      surfaceBasis: r.surfaceBasis as "measured" | "estimated" | "air",
      hoursAt80: round(r.hoursAt80, 1),
      hoursCondensing: round(r.hoursCondensing, 1),
      condensingDays: r.condensingDays,
      mouldIndex: round(r.mouldIndex, 2),
      days: r.days.map((d) => ({ date: d.date, hoursAt80: round(d.hoursAt80, 1), hoursCondensing: round(d.hoursCondensing, 1) })),
      latestReadingAt: r.latestReadingAt.toISOString(),
      latestAirTemperatureC: r.latestAirTemperatureC,
      latestRelativeHumidityPct: r.latestRelativeHumidityPct,
      latestSurfaceRelativeHumidityPct: round(r.latestSurfaceRelativeHumidityPct, 1),
      computedAt: r.computedAt.toISOString(),
    })),
  };
}
