import { ValidationError } from "../../lib/errors.js";

/** Readings are taken in rooms of the case's home: a 400 naming any other room (the session and key routes share it). */
export function requireRoomOfCase(roomIds: number[], caseRooms: { id: number }[]): void {
  const ok = new Set(caseRooms.map((r) => r.id));
  const bad = roomIds.filter((r) => !ok.has(r));
  if (bad.length)
    throw new ValidationError("roomId: choose a room of this home.", [
      { field: "roomId", message: `Room ${bad.join(", ")} is not part of this home.` },
    ]);
}
