import type { ReactNode } from "react";
import { formatDate } from "@/lib/dates";
import type { Area, Duration, EquipmentAnswer, Location, Observation, Vulnerability } from "@/lib/schemas/case-report";
import {
  EQUIPMENT_QUESTIONS,
  areaLabels,
  durationLabels,
  equipmentQuestions,
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
  equipment?: Partial<Record<(typeof EQUIPMENT_QUESTIONS)[number], EquipmentAnswer | string | undefined>> | null;
}

interface ReportSummaryProps {
  answers: ReportAnswers;
  /** In the form: a "Change" button per group that goes back to its step. */
  onChange?: (step: number) => void;
  /** Sent reports show when they were sent. */
  sentAt?: string;
  extra?: ReactNode;
}

const notSaid = "Not answered";

export function ReportSummary({ answers, onChange, sentAt, extra }: ReportSummaryProps) {
  const household =
    answers.vulnerability === undefined || answers.vulnerability === null
      ? answers.householdDeclined
        ? "You'd rather not say"
        : notSaid
      : answers.vulnerability.length === 0
        ? householdNoneLabel
        : answers.vulnerability.map((v) => labelFor(vulnerabilityLabels, v));

  return (
    <dl className="flex flex-col divide-y divide-line">
      {sentAt ? <Row term="Sent on" value={formatDate(sentAt)} /> : null}
      <Row term="What you can see" value={answers.description || notSaid} step={0} onChange={onChange} preserveLines />
      <Row
        term="Where"
        value={answers.locations.length ? answers.locations.map((l) => labelFor(locationLabels, l)) : notSaid}
        step={0}
        onChange={onChange}
      />
      <Row
        term="What you've noticed"
        value={answers.observations.length ? answers.observations.map((o) => labelFor(observationLabels, o)) : notSaid}
        step={0}
        onChange={onChange}
      />
      <Row term="Rooms" value={answers.roomNames.length ? [...answers.roomNames] : notSaid} step={0} onChange={onChange} />
      <Row
        term="How long"
        value={answers.since ? labelFor(durationLabels, answers.since) : notSaid}
        step={1}
        onChange={onChange}
      />
      <Row term="How big" value={answers.area ? labelFor(areaLabels, answers.area) : notSaid} step={1} onChange={onChange} />
      {EQUIPMENT_QUESTIONS.map((q) => {
        const answer = answers.equipment?.[q];
        return (
          <Row
            key={q}
            term={equipmentQuestions[q].question}
            value={answer ? labelFor(equipmentQuestions[q].answers, answer) : notSaid}
            step={2}
            onChange={onChange}
          />
        );
      })}
      <Row term="Your household" value={household} step={2} onChange={onChange} />
      {extra}
    </dl>
  );
}

interface RowProps {
  term: string;
  value: string | string[];
  step?: number;
  onChange?: (step: number) => void;
  preserveLines?: boolean;
}

export function Row({ term, value, step, onChange, preserveLines }: RowProps) {
  return (
    <div className="flex flex-col gap-1 py-3 sm:flex-row sm:gap-4">
      <dt className="font-semibold sm:w-2/5">{term}</dt>
      <dd className="flex flex-1 items-start justify-between gap-3">
        {Array.isArray(value) ? (
          <ul className="list-disc pl-5">
            {value.map((v) => (
              <li key={v}>{v}</li>
            ))}
          </ul>
        ) : (
          <span className={preserveLines ? "break-words whitespace-pre-line" : undefined}>{value}</span>
        )}
        {onChange && step !== undefined ? (
          <button
            type="button"
            onClick={() => onChange(step)}
            className="min-h-9 shrink-0 rounded-md px-2 font-semibold text-dew-700 underline underline-offset-2 hover:bg-dew-50"
          >
            Change<span className="sr-only"> {term.toLowerCase()}</span>
          </button>
        ) : null}
      </dd>
    </div>
  );
}
