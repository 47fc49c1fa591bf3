import type { z } from "zod";
import type { propertyResponse, propertySummaryResponse, roomResponse } from "../../../src/lib/contracts/properties.js";
import type { Property } from "./property.entity.js";
import type { Room } from "./room.entity.js";

export const toRoomDto = (r: Room): z.input<typeof roomResponse> => ({ id: r.id, name: r.name, kind: r.kind });

export const toPropertySummaryDto = (p: Property): z.input<typeof propertySummaryResponse> => ({
  id: p.id,
  addressLine1: p.addressLine1,
  addressLine2: p.addressLine2,
  town: p.town,
  postcode: p.postcode,
  uprn: p.uprn,
  estate: p.estate,
  block: p.block,
  builtForm: p.builtForm,
  wallType: p.wallType,
  glazingType: p.glazingType,
  heatingType: p.heatingType,
  ventilation: p.ventilation,
  builtYear: p.builtYear ?? null,
  ageBand: p.ageBand ?? null,
  wallInsulation: p.wallInsulation ?? null,
  roofInsulationMm: p.roofInsulationMm ?? null,
  heatingFuel: p.heatingFuel ?? null,
  hasExtractFans: p.hasExtractFans === null || p.hasExtractFans === undefined ? null : Boolean(p.hasExtractFans),
  hasTrickleVents: p.hasTrickleVents === null || p.hasTrickleVents === undefined ? null : Boolean(p.hasTrickleVents),
  floorAreaM2: p.floorAreaM2 ?? null,
  epcBand: p.epcBand ?? null,
  latitude: p.latitude ?? null,
  longitude: p.longitude ?? null,
});

export const toPropertyDto = (p: Property): z.input<typeof propertyResponse> => ({
  ...toPropertySummaryDto(p),
  rooms: (p.rooms ?? [])
    .slice()
    .sort((a, b) => a.id - b.id)
    .map(toRoomDto),
});

export type PropertySummaryDto = z.input<typeof propertySummaryResponse>;
export type PropertyDto = z.input<typeof propertyResponse>;
