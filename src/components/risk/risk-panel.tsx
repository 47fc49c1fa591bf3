// The risk engine's answer for one reading, in words and numbers. Presentational only: the
// calculator, the tenant's report and the officer's case view each pass it a result.
import type { TFunction } from "i18next";
import { useId, type ReactNode } from "react";
import { useTranslation } from "react-i18next";
import {
  BORDERLINE_SURFACE_RH_PCT,
  CRITICAL_TEMPERATURE_FACTOR,
  MOULD_SURFACE_RH_PCT,
  type PointReason,
  type PointResult,
  type SurfaceResult,
  type SurfaceState,
} from "@/lib/domain";
import { factor, fixed } from "@/lib/domain/wording";
import { cn } from "@/lib/cn";
import { i18n } from "@/lib/i18n/i18n";

// Numbers are rounded half up on the decimal value first (src/lib/domain/wording.ts), then written the
// reader's way by ICU, so every language shows the same figure.
export const celsiusIn = (t: TFunction, value: number) => t("risk:panel.celsius", { value: Number(fixed(value, 1)) });
const factorIn = (t: TFunction, value: number) => t("risk:panel.factorValue", { value: Number(factor(value)) });

/** Above 100 % the surface is below the dew point: said as condensing, never as a percentage. */
export const surfaceHumidityIn = (t: TFunction, value: number) =>
  value > 100 ? t("risk:panel.condensingValue") : t("risk:panel.percent", { value: Number(fixed(value, 0)) });

/** A surface state's badge text, one-line summary and longer explanation in the reader's language. */
export function stateWords(t: TFunction, state: SurfaceState) {
  const values = { mould: MOULD_SURFACE_RH_PCT, borderline: BORDERLINE_SURFACE_RH_PCT };
  return {
    label: t(`risk:state.${state}.label`),
    summary: t(`risk:state.${state}.summary`),
    explanation: t(`risk:state.${state}.explanation`, values),
  };
}

export interface RiskPanelProps {
  result: PointResult;
  /** A heading for the panel; without one the panel is a plain group inside its parent's section. */
  title?: ReactNode;
  /** Heading level of the title, so the page outline stays right (2 by default). */
  headingLevel?: 2 | 3;
  /** Badge and key numbers only, with the reasons folded away: for lists and side panels. */
  compact?: boolean;
  className?: string;
}

const badgeTones: Record<SurfaceState, string> = {
  condensing: "border-risk-condensing-edge bg-risk-condensing-bg text-risk-condensing-fg",
  "mould-risk": "border-risk-mould-edge bg-risk-mould-bg text-risk-mould-fg",
  borderline: "border-risk-borderline-edge bg-risk-borderline-bg text-risk-borderline-fg",
  dry: "border-risk-dry-edge bg-risk-dry-bg text-risk-dry-fg",
};

export function RiskPanel({ result, title, headingLevel = 2, compact = false, className }: RiskPanelProps) {
  const { t } = useTranslation("risk", { i18n });
  const headingId = useId();
  const { surface } = result;
  const state = stateWords(t, surface.state);
  const Heading = headingLevel === 2 ? "h2" : "h3";
  const Tag = title ? "section" : "div";

  return (
    <Tag
      aria-labelledby={title ? headingId : undefined}
      className={cn(
        "flex flex-col rounded-lg border border-line bg-surface shadow-card",
        compact ? "gap-3 p-3" : "gap-4 p-4 sm:p-5",
        className,
      )}
    >
      {title ? (
        <Heading id={headingId} className={cn("font-bold text-ink", headingLevel === 2 ? "text-xl" : "text-lg")}>
          {title}
        </Heading>
      ) : null}

      <div
        className={cn(
          "flex items-start gap-3 rounded-md border-2",
          compact ? "px-3 py-2" : "px-4 py-3",
          badgeTones[surface.state],
        )}
      >
        <StateIcon state={surface.state} className={cn("shrink-0", compact ? "size-6" : "size-8")} />
        <div className="flex flex-col gap-0.5">
          <p className={cn("font-bold", compact ? "text-base" : "text-lg")}>
            <span className="sr-only">{t("panel.surfaceState")}</span>
            <span>{surface.source === "estimated" ? t("panel.estimateLabel", { label: state.label }) : state.label}</span>
          </p>
          <p className={compact ? "text-sm" : undefined}>{state.summary}</p>
          {surface.source === "estimated" ? <p className={compact ? "text-sm" : undefined}>{t("panel.estimateNote")}</p> : null}
        </div>
      </div>
      {compact ? null : <p className="text-ink-soft">{state.explanation}</p>}

      <dl
        className={cn(
          "grid gap-x-4",
          compact ? "grid-cols-1 gap-y-1 text-sm sm:grid-cols-2" : "grid-cols-1 gap-y-3 sm:grid-cols-2",
        )}
      >
        <Figure term={t("panel.dewPoint")} value={celsiusIn(t, result.dewPointC)}>
          {compact ? null : t("panel.dewPointHint")}
        </Figure>
        <Figure term={t("panel.surfaceTemperature")} value={celsiusIn(t, surface.temperatureC)}>
          {t(`source.${surface.source}`)}. {compact ? null : dewPointGap(t, surface.temperatureC, result.dewPointC)}
        </Figure>
        <Figure term={t("panel.surfaceHumidity")} value={surfaceHumidityIn(t, surface.relativeHumidityPct)}>
          {surface.relativeHumidityPct >= 100 ? t("panel.saturated") : null}
        </Figure>
        {surface.temperatureFactor !== undefined ? (
          <Figure term={t("panel.temperatureFactor")} value={factorIn(t, surface.temperatureFactor)}>
            {temperatureFactorWords(t, surface)}
          </Figure>
        ) : null}
        <Figure
          term={t("panel.absoluteHumidity")}
          value={t("panel.gramsPerCubicMetre", { value: Number(fixed(result.absoluteHumidityGPerM3, 1)) })}
        >
          {compact ? null : t("panel.absoluteHumidityHint")}
        </Figure>
      </dl>

      {result.reasons.length ? (
        compact ? (
          <details className="text-sm">
            <summary className="cursor-pointer rounded-sm font-semibold text-dew-700">{t("panel.why")}</summary>
            <Reasons result={result} />
          </details>
        ) : (
          <div>
            <p className="font-bold">{t("panel.why")}</p>
            <Reasons result={result} />
          </div>
        )
      ) : null}
    </Tag>
  );
}

function Figure({ term, value, children }: { term: string; value: string; children?: ReactNode }) {
  return (
    <div className="flex flex-col">
      <dt className="text-sm font-semibold text-ink-soft">{term}</dt>
      <dd className="flex flex-col">
        <span className="text-lg font-bold text-ink tabular-nums">{value}</span>
        {children ? <span className="text-sm text-ink-soft">{children}</span> : null}
      </dd>
    </div>
  );
}

/**
 * A reason in the reader's language, by its id: the word ids among its values (the surface's noun, the
 * building element) are said first, then put in the sentence with its figures.
 */
export function reasonIn(t: TFunction, reason: PointReason): string {
  const { noun, element, ...values } = reason.values;
  return t(`risk:reason.${reason.id}`, {
    ...values,
    subject: t(`risk:reason.subject.${noun ?? "none"}`),
    phrase: t(`risk:reason.phrase.${element ?? "none"}`),
  });
}

function Reasons({ result }: { result: PointResult }) {
  const { t } = useTranslation("risk", { i18n });
  // A result from an older server without ids keeps its English reasons.
  const reasons = result.reasonIds ? result.reasonIds.map((r) => reasonIn(t, r)) : result.reasons;
  return (
    <ul className="mt-1 list-disc space-y-1 pl-5">
      {reasons.map((reason) => (
        <li key={reason}>{reason}</li>
      ))}
    </ul>
  );
}

function dewPointGap(t: TFunction, surfaceC: number, dewPointC: number): string {
  const gap = surfaceC - dewPointC;
  if (fixed(Math.abs(gap), 1) === "0.0") return t("risk:panel.atDewPoint");
  const size = celsiusIn(t, Math.abs(gap));
  return gap < 0 ? t("risk:panel.colder", { gap: size }) : t("risk:panel.warmer", { gap: size });
}

function temperatureFactorWords(t: TFunction, surface: SurfaceResult): string {
  const value = surface.temperatureFactor ?? 0;
  const basis = t(surface.source === "estimated" ? "risk:panel.factorEstimated" : "risk:panel.factorMeasured");
  // Compare the value as shown, so "0.75" never reads as below 0.75.
  const meets = Number(factor(value)) >= CRITICAL_TEMPERATURE_FACTOR;
  return `${basis} ${t(meets ? "risk:panel.factorMeets" : "risk:panel.factorBelow", { critical: CRITICAL_TEMPERATURE_FACTOR })}`;
}

/** Our own icons, one shape per state so the badge reads without colour. */
function StateIcon({ state, className }: { state: SurfaceState; className?: string }) {
  const common = { viewBox: "0 0 32 32", className, "aria-hidden": true, focusable: false } as const;
  switch (state) {
    case "condensing":
      // Three drops running down a pane.
      return (
        <svg {...common}>
          <path d="M9 5c-2.4 3.6-4 6-4 8.2a4 4 0 0 0 8 0C13 11 11.4 8.6 9 5z" fill="currentColor" />
          <path d="M21 3c-2 3-3.4 5-3.4 6.9a3.4 3.4 0 0 0 6.8 0C24.4 8 23 6 21 3z" fill="currentColor" />
          <path d="M17 16c-2.6 3.9-4.4 6.5-4.4 8.9a4.4 4.4 0 0 0 8.8 0c0-2.4-1.8-5-4.4-8.9z" fill="currentColor" />
        </svg>
      );
    case "mould-risk":
      // A warning triangle with spots inside.
      return (
        <svg {...common}>
          <path d="M16 3 30 28H2L16 3z" fill="none" stroke="currentColor" strokeWidth="2.5" strokeLinejoin="round" />
          <circle cx="16" cy="15" r="2.2" fill="currentColor" />
          <circle cx="12" cy="22" r="2" fill="currentColor" />
          <circle cx="20" cy="22" r="2" fill="currentColor" />
        </svg>
      );
    case "borderline":
      // A half-filled gauge.
      return (
        <svg {...common}>
          <circle cx="16" cy="16" r="12" fill="none" stroke="currentColor" strokeWidth="2.5" />
          <path d="M16 4a12 12 0 0 1 0 24z" fill="currentColor" />
        </svg>
      );
    case "dry":
      // A tick in a circle.
      return (
        <svg {...common}>
          <circle cx="16" cy="16" r="12" fill="none" stroke="currentColor" strokeWidth="2.5" />
          <path
            d="m10 16.5 4 4 8-9"
            fill="none"
            stroke="currentColor"
            strokeWidth="3"
            strokeLinecap="round"
            strokeLinejoin="round"
          />
        </svg>
      );
  }
}
