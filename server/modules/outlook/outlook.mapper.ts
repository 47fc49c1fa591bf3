import type { z } from "zod";
import type { outlookResponse } from "../../../src/lib/contracts/outlook.js";
import type { HomeOutlook } from "./outlook.service.js";

const round = (value: number, digits: number) => Number(value.toFixed(digits));
const roundOrNull = (value: number | null, digits: number) => (value === null ? null : round(value, digits));

export function toOutlookDto(o: HomeOutlook): z.input<typeof outlookResponse> {
  return {
    propertyId: o.property.id,
    generatedAt: o.generatedAt.toISOString(),
    timeZone: o.timeZone,
    dates: o.dates,
    forecastAvailable: o.forecastAvailable,
    surface: { elementId: o.surface.id, label: o.surface.label, fRsi: round(o.surface.fRsi, 3), basis: o.surface.basis },
    rooms: o.rooms.map(({ room, indoor, outlook }) => ({
      roomId: room.id,
      name: room.name,
      kind: room.kind,
      indoor: {
        airTemperatureC: round(indoor.airTemperatureC, 1),
        relativeHumidityPct: round(indoor.relativeHumidityPct, 1),
        source: indoor.source,
        takenAt: indoor.takenAt ? indoor.takenAt.toISOString() : null,
      },
      days: outlook.days.map((d) => ({
        ...d,
        coldestSurfaceTemperatureC: roundOrNull(d.coldestSurfaceTemperatureC, 1),
        highestSurfaceRelativeHumidityPct: roundOrNull(d.highestSurfaceRelativeHumidityPct, 1),
        lowestOutdoorTemperatureC: roundOrNull(d.lowestOutdoorTemperatureC, 1),
      })),
      hours: outlook.hours.map((h) => ({
        at: h.at.toISOString(),
        outdoorTemperatureC: round(h.outdoorTemperatureC, 1),
        surfaceTemperatureC: round(h.surfaceTemperatureC, 2),
        surfaceRelativeHumidityPct: round(h.surfaceRelativeHumidityPct, 1),
      })),
    })),
    tips: o.tips.map((t) => ({ ...t, values: { ...t.values } })),
    cautions: o.cautions.map((c) => ({ ...c, values: { ...c.values } })),
    method: o.method.map((m) => ({ ...m, values: { ...m.values } })),
  };
}
