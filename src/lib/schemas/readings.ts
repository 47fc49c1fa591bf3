// When a reading may have been taken: shared by the server (hand-typed readings and logger imports)
// and the client's reading form, so both refuse the same times with the same words.

/**
 * How far ahead of "now" a reading's time may be: a phone's or a logger's clock that runs a little
 * fast (ours, common practice, no source). Anything later has not happened yet and is refused.
 */
export const READING_CLOCK_SKEW_MS = 5 * 60_000;

/** The words for a reading time that has not happened yet. */
export const FUTURE_READING_MESSAGE = "The time is in the future. Please check the date and time the reading was taken.";

/** True when a reading taken at `takenAtMs` lies in the future as seen at `nowMs` (beyond the clock-skew allowance). */
export function isFutureReading(takenAtMs: number, nowMs: number): boolean {
  return takenAtMs > nowMs + READING_CLOCK_SKEW_MS;
}
