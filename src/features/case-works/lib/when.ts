// Instants as people in England read them (Europe/London wall-clock time).
const dateTime = new Intl.DateTimeFormat("en-GB", {
  timeZone: "Europe/London",
  day: "numeric",
  month: "short",
  year: "numeric",
  hour: "2-digit",
  minute: "2-digit",
  timeZoneName: "short",
});
const dateOnly = new Intl.DateTimeFormat("en-GB", { timeZone: "Europe/London", weekday: "long", day: "numeric", month: "long", year: "numeric" });

const valid = (iso: string | null | undefined): Date | null => {
  if (!iso) return null;
  const d = new Date(iso);
  return Number.isNaN(d.getTime()) ? null : d;
};

/** "3 Dec 2026, 14:05 GMT". */
export const formatLondon = (iso: string | null | undefined) => {
  const d = valid(iso);
  return d ? dateTime.format(d) : (iso ?? "");
};

/** "Thursday 24 December 2026" for an instant, in London. */
export const formatLondonDay = (iso: string | null | undefined) => {
  const d = valid(iso);
  return d ? dateOnly.format(d).replace(",", "") : (iso ?? "");
};
