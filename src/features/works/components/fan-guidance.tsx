import { cn } from "@/lib/cn";
import { CONTINUOUS_EXTRACT_RATES, ELECTRICAL_CAUTION, INTERMITTENT_EXTRACT_RATES, type ExtractRate } from "@/lib/extract-rates";

function RateList({ rates }: { rates: readonly ExtractRate[] }) {
  return (
    <ul className="list-disc pl-5">
      {rates.map((rate) => (
        <li key={`${rate.room}-${rate.litresPerSecond}`}>
          {rate.label}: <strong>{rate.litresPerSecond} l/s</strong>
          {rate.condition ? ` ${rate.condition}` : ""}
        </li>
      ))}
    </ul>
  );
}

/** Approved Document F extract rates and the electrical caution, shown beside extractor-fan work. */
export function FanGuidance({ className, headingLevel = 3 }: { className?: string; headingLevel?: 3 | 4 }) {
  const Heading = headingLevel === 3 ? "h3" : "h4";
  return (
    <aside aria-label="Extract rates for fan work" className={cn("rounded-md border-l-4 border-dew-600 bg-dew-50 px-4 py-3 text-sm text-ink", className)}>
      <Heading className="font-bold text-dew-800">Extract rates for fan work</Heading>
      <div className="mt-1 grid gap-3 sm:grid-cols-2">
        <div>
          <p className="font-semibold">Intermittent extract (minimum)</p>
          <RateList rates={INTERMITTENT_EXTRACT_RATES} />
          <p className="mt-1 text-ink-soft">Source: {INTERMITTENT_EXTRACT_RATES[0]!.source}.</p>
        </div>
        <div>
          <p className="font-semibold">Continuous extract, high rate (minimum)</p>
          <RateList rates={CONTINUOUS_EXTRACT_RATES} />
          <p className="mt-1 text-ink-soft">Source: {CONTINUOUS_EXTRACT_RATES[0]!.source}.</p>
        </div>
      </div>
      <p className="mt-2 flex items-start gap-1 font-semibold">
        <svg viewBox="0 0 16 16" className="mt-0.5 size-4 shrink-0 text-ember-800" aria-hidden="true">
          <path d="M8 1.2 15 14H1z" fill="currentColor" />
          <path d="M8 5.5v4M8 11.6v.1" stroke="#fff" strokeWidth="1.7" strokeLinecap="round" />
        </svg>
        <span>{ELECTRICAL_CAUTION}</span>
      </p>
    </aside>
  );
}
