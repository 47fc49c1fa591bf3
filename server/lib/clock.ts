// "Now" for the server: one Clock, owned by the AppContext and handed to every service, route and
// background job that needs it, so tests (and a dry run at a chosen date) can set the time.
export interface Clock {
  now(): Date;
}

export const systemClock: Clock = { now: () => new Date() };
