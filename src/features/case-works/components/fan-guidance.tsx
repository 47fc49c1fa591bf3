import { CONTINUOUS_EXTRACT_HIGH, EXTRACT_RATES_SOURCE, INTERMITTENT_EXTRACT } from "../lib/extract-rates";

/** Extract rates for fan work, with their source, and the caution that fans are electrical work. */
export function FanGuidance() {
  return (
    <aside aria-label="Extract rates for fans" className="flex flex-col gap-2 rounded-md border border-dew-600 bg-dew-50 p-3 text-sm">
      <p className="font-bold">Extract rates for fans</p>
      <p>
        Minimum rates from <cite>{EXTRACT_RATES_SOURCE}</cite>. Choose a fan that reaches at least the rate for the room.
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
            {INTERMITTENT_EXTRACT.map((r) => (
              <tr key={`${r.room}-${r.litresPerSecond}`}>
                <td className="pr-3">
                  {r.room}
                  {r.note ? <span className="text-ink-soft"> ({r.note})</span> : null}
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
            {CONTINUOUS_EXTRACT_HIGH.map((r) => (
              <tr key={r.room}>
                <td className="pr-3">{r.room}</td>
                <td>{r.litresPerSecond} l/s</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <p>
        <strong>Fitting or wiring a fan is electrical work.</strong> It must be done by a qualified electrician and follow local
        regulations (in England, Part P of the Building Regulations).
      </p>
    </aside>
  );
}
