import { cn } from "@/lib/cn";
import {
  CONTINUOUS_EXTRACT_RATES,
  ELECTRICAL_CAUTION,
  EXTRACT_RATES_DOCUMENT,
  INTERMITTENT_EXTRACT_RATES,
  type ExtractRate,
} from "@/lib/extract-rates";

function RateTable({ caption, rates }: { caption: string; rates: readonly ExtractRate[] }) {
  return (
    <table className="text-left">
      <caption className="text-left font-semibold">{caption}</caption>
      <thead>
        <tr>
          <th scope="col" className="pr-3 font-semibold">
            Room
          </th>
          <th scope="col" className="font-semibold">
            Rate
          </th>
        </tr>
      </thead>
      <tbody>
        {rates.map((r) => (
          <tr key={`${r.room}-${r.litresPerSecond}`}>
            <td className="pr-3">
              {r.label}
              {r.condition ? <span className="text-ink-soft"> ({r.condition})</span> : null}
            </td>
            <td className="whitespace-nowrap">{r.litresPerSecond} l/s</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}

interface FanGuidanceProps {
  className?: string;
  /** The heading's level where the note sits: 3 under a page section, 4 under a sub-section. */
  headingLevel?: 3 | 4;
}

/**
 * Extract rates for fan work, with their source, and the caution that fans are electrical work.
 * Shown beside extractor-fan work wherever it is ordered or booked (the figures: src/lib/extract-rates.ts).
 */
export function FanGuidance({ className, headingLevel = 3 }: FanGuidanceProps) {
  const Heading = headingLevel === 3 ? "h3" : "h4";
  return (
    <aside
      aria-label="Extract rates for fan work"
      className={cn("flex flex-col gap-2 rounded-md border-l-4 border-dew-600 bg-dew-50 px-4 py-3 text-sm text-ink", className)}
    >
      <Heading className="font-bold text-dew-800">Extract rates for fan work</Heading>
      <p>
        Minimum rates from <cite>{EXTRACT_RATES_DOCUMENT}</cite>. Choose a fan that reaches at least the rate for the room.
      </p>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2">
        <RateTable caption="Intermittent extract" rates={INTERMITTENT_EXTRACT_RATES} />
        <RateTable caption="Continuous extract, high rate" rates={CONTINUOUS_EXTRACT_RATES} />
      </div>
      <p className="flex items-start gap-1 font-semibold">
        <svg viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0 text-ember-800" aria-hidden="true">
          <path d="M8 1.2 15 14H1z" fill="currentColor" />
          <path d="M8 5.5v4M8 11.6v.1" stroke="#fff" strokeWidth="1.7" strokeLinecap="round" />
        </svg>
        <span>{ELECTRICAL_CAUTION}</span>
      </p>
    </aside>
  );
}
