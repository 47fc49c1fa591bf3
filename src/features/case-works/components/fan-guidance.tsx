import { CONTINUOUS_EXTRACT_RATES, ELECTRICAL_CAUTION, EXTRACT_RATES_DOCUMENT, INTERMITTENT_EXTRACT_RATES } from "@/lib/extract-rates";

/** Extract rates for fan work, with their source, and the caution that fans are electrical work. */
export function FanGuidance() {
  return (
    <aside aria-label="Extract rates for fans" className="flex flex-col gap-2 rounded-md border border-dew-600 bg-dew-50 p-3 text-sm">
      <p className="font-bold">Extract rates for fans</p>
      <p>
        Minimum rates from <cite>{EXTRACT_RATES_DOCUMENT}</cite>. Choose a fan that reaches at least the rate for the room.
      </p>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <table className="text-left">
          <caption className="text-left font-semibold">Intermittent extract</caption>
          <thead>
            <tr>
              <th scope="col" className="pr-3 font-semibold">Room</th>
              <th scope="col" className="font-semibold">Rate</th>
            </tr>
          </thead>
          <tbody>
            {INTERMITTENT_EXTRACT_RATES.map((r) => (
              <tr key={`${r.room}-${r.litresPerSecond}`}>
                <td className="pr-3">
                  {r.label}
                  {r.condition ? <span className="text-ink-soft"> ({r.condition})</span> : null}
                </td>
                <td>{r.litresPerSecond} l/s</td>
              </tr>
            ))}
          </tbody>
        </table>
        <table className="text-left">
          <caption className="text-left font-semibold">Continuous extract, high rate</caption>
          <thead>
            <tr>
              <th scope="col" className="pr-3 font-semibold">Room</th>
              <th scope="col" className="font-semibold">Rate</th>
            </tr>
          </thead>
          <tbody>
            {CONTINUOUS_EXTRACT_RATES.map((r) => (
              <tr key={r.room}>
                <td className="pr-3">{r.label}</td>
                <td>{r.litresPerSecond} l/s</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p className="font-semibold">{ELECTRICAL_CAUTION}</p>
    </aside>
  );
}
