import { useId, type ReactNode } from "react";
import { formatDate } from "@/lib/dates";
import type { Area, Duration, EquipmentAnswer, Location, Observation, Vulnerability } from "@/lib/schemas/case-report";
import {
  EQUIPMENT_QUESTIONS,
  areaLabels,
  durationLabels,
  equipmentQuestions,
  heatingCostQuestion,
  householdNoneLabel,
  labelFor,
  locationLabels,
  observationLabels,
  vulnerabilityLabels,
} from "../labels";

/** A report's answers, from the form or from a sent case. */
export interface ReportAnswers {
  description: string;
  locations: readonly (Location | string)[];
  observations: readonly (Observation | string)[];
  roomNames: readonly string[];
  since?: Duration | string | null;
  area?: Area | string | null;
  vulnerability?: readonly (Vulnerability | string)[] | null;
  /** True when the person chose "I'd rather not say" (only known while the form is open). */
  householdDeclined?: boolean;
  equipment?:
    | (Partial<Record<(typeof EQUIPMENT_QUESTIONS)[number], EquipmentAnswer | string | undefined>> & { heatingCost?: string })
    | null;
}

interface ReportSummaryProps {
  answers: ReportAnswers;
  /** In the form: a "Change" button per group that goes back to its step. */
  onChange?: (step: number) => void;
  /** Sent reports show when they were sent. */
  sentAt?: string;
  extra?: ReactNode;
  /** Staff read the same answers about "the" home and household, not "your". */
  audience?: "tenant" | "staff";
}

const notSaid = "Not answered";

export function ReportSummary({ answers, onChange, sentAt, extra, audience = "tenant" }: ReportSummaryProps) {
  const staff = audience === "staff";
  const household =
    answers.vulnerability === undefined || answers.vulnerability === null
      ? answers.householdDeclined
        ? staff
          ? "The tenant would rather not say"
          : "You'd rather not say"
        : notSaid
      : answers.vulnerability.length === 0
        ? householdNoneLabel
        : answers.vulnerability.map((v) => labelFor(vulnerabilityLabels, v));

  return (
    <div className="flex flex-col gap-3">
      {sentAt ? <p className="text-ink-soft">Sent on {formatDate(sentAt)}</p> : null}
      <SummaryCard title={staff ? "What can be seen, and where" : "What you can see, and where"} step={0} onChange={onChange}>
        <Row term={staff ? "What the tenant can see" : "What you can see"} value={answers.description || notSaid} preserveLines />
        <Row
          term="Where"
          value={answers.locations.length ? answers.locations.map((l) => labelFor(locationLabels, l)) : notSaid}
        />
        <Row
          term={staff ? "What the tenant has noticed" : "What you've noticed"}
          value={answers.observations.length ? answers.observations.map((o) => labelFor(observationLabels, o)) : notSaid}
        />
        <Row term="Rooms" value={answers.roomNames.length ? [...answers.roomNames] : notSaid} />
      </SummaryCard>
      <SummaryCard title="How long, and how big" step={1} onChange={onChange}>
        <Row term="How long" value={answers.since ? labelFor(durationLabels, answers.since) : notSaid} />
        <Row term="How big" value={answers.area ? labelFor(areaLabels, answers.area) : notSaid} />
      </SummaryCard>
      <SummaryCard title={staff ? "About the home and household" : "About your home and household"} step={2} onChange={onChange}>
        {EQUIPMENT_QUESTIONS.map((q) => {
          const answer = answers.equipment?.[q];
          return (
            <Row
              key={q}
              term={equipmentQuestions[q].question}
              value={answer ? labelFor(equipmentQuestions[q].answers, answer) : notSaid}
            />
          );
        })}
        <Row term={staff ? "The household" : "Your household"} value={household} />
        <Row
          term={heatingCostQuestion.question}
          value={answers.equipment?.heatingCost ? labelFor(heatingCostQuestion.answers, answers.equipment.heatingCost) : notSaid}
        />
      </SummaryCard>
      {extra}
    </div>
  );
}

interface SummaryCardProps {
  title: string;
  /** The form step these answers come from; with `onChange`, the card offers a way back to it. */
  step?: number;
  onChange?: (step: number) => void;
  children: ReactNode;
}

/**
 * One step's answers as a card: the step's name with its own "Change" button in the card's top
 * edge, then each question with its answer underneath (Dewline's own layout, one card per step).
 */
export function SummaryCard({ title, step, onChange, children }: SummaryCardProps) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="rounded-lg border border-line bg-surface shadow-card">
      <div className="flex items-center justify-between gap-3 rounded-t-lg bg-dew-50 px-4 py-2">
        <h3 id={headingId} className="font-bold text-dew-800">
          {title}
        </h3>
        {onChange && step !== undefined ? (
          <button
            type="button"
            onClick={() => onChange(step)}
            className="inline-flex min-h-9 shrink-0 items-center gap-1.5 rounded-pill border border-dew-600 bg-surface px-3 text-sm font-semibold text-dew-700 hover:bg-dew-100"
          >
            <svg viewBox="0 0 16 16" className="size-3.5" aria-hidden="true" focusable="false">
              <path
                d="M11.5 2.5l2 2L6 12l-2.8.8L4 10z"
                fill="none"
                stroke="currentColor"
                strokeWidth="1.6"
                strokeLinejoin="round"
              />
            </svg>
            Change<span className="sr-only"> {title.toLowerCase()}</span>
          </button>
        ) : null}
      </div>
      <dl className="flex flex-col gap-3 px-4 py-3">{children}</dl>
    </section>
  );
}

interface RowProps {
  term: string;
  value: string | string[];
  preserveLines?: boolean;
}

/** A question and its answer inside a SummaryCard: the question small above, the answer as read. */
export function Row({ term, value, preserveLines }: RowProps) {
  return (
    <div className="flex flex-col gap-0.5">
      <dt className="text-sm text-ink-soft">{term}</dt>
      <dd className="font-semibold text-ink">
        {Array.isArray(value) ? (
          <ul className="flex flex-wrap gap-1.5 pt-0.5">
            {value.map((v) => (
              <li key={v} className="rounded-pill bg-paper px-2.5 py-0.5 text-sm font-semibold ring-1 ring-line">
                {v}
              </li>
            ))}
          </ul>
        ) : (
          <span className={preserveLines ? "break-words whitespace-pre-line" : undefined}>{value}</span>
        )}
      </dd>
    </div>
  );
}
