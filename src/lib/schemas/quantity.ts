// Numbers with their unit, in words people read: "1 hour", "2 hours", "1 working day".
import { z } from "zod";

export interface Unit {
  one: string;
  many: string;
}

/** "1 hour", "72 hours": the unit agrees with the number. */
export const quantity = (n: number, unit: Unit) => `${n} ${n === 1 ? unit.one : unit.many}`;

/**
 * A whole number between `min` and `max` of `unit`, with messages that name the field and agree in
 * number ("must be at least 1 hour", "must be at most 72 hours").
 */
export const wholeNumberOf = (field: string, min: number, max: number, unit: Unit) =>
  z
    .number({ error: `${field} must be a whole number of ${unit.many}.` })
    .int(`${field} must be a whole number of ${unit.many}.`)
    .min(min, `${field} must be at least ${quantity(min, unit)}.`)
    .max(max, `${field} must be at most ${quantity(max, unit)}.`);
