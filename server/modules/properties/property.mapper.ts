import type { Property } from "./property.entity.js";
import type { Room } from "./room.entity.js";

export const toRoomDto = (r: Room) => ({ id: r.id, name: r.name, kind: r.kind });

export const toPropertySummaryDto = (p: Property) => ({
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
});

export const toPropertyDto = (p: Property) => ({
  ...toPropertySummaryDto(p),
  rooms: (p.rooms ?? []).slice().sort((a, b) => a.id - b.id).map(toRoomDto),
});

export type PropertySummaryDto = ReturnType<typeof toPropertySummaryDto>;
export type PropertyDto = ReturnType<typeof toPropertyDto>;
