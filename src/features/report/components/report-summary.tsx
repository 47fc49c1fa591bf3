import { useId, type ReactNode } from "react";
import { useTranslation } from "react-i18next";
import { formatDate } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import type { Area, Duration, EquipmentAnswer, Location, Observation, Vulnerability } from "@/lib/schemas/case-report";
import { EQUIPMENT_QUESTIONS, equipmentQuestion, labelFor } from "../labels";

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

export function ReportSummary({ answers, onChange, sentAt, extra, audience = "tenant" }: ReportSummaryProps) {
  const { t } = useTranslation("report", { i18n });
  const staff = audience === "staff";
  const notSaid = t("summary.notAnswered");
  const heatingCost = equipmentQuestion(t, "heatingCost");
  const household =
    answers.vulnerability === undefined || answers.vulnerability === null
      ? answers.householdDeclined
        ? t(staff ? "summary.declinedStaff" : "summary.declined")
        : notSaid
      : answers.vulnerability.length === 0
        ? t("household.none")
        : answers.vulnerability.map((v) => labelFor(t, "vulnerability", v));

  return (
    <div className="flex flex-col gap-3">
      {sentAt ? <p className="text-ink-soft">{t("summary.sentOn", { when: formatDate(sentAt) })}</p> : null}
      <SummaryCard title={t(staff ? "summary.describeTitleStaff" : "summary.describeTitle")} step={0} onChange={onChange}>
        <Row
          term={t(staff ? "summary.whatTenantSees" : "summary.whatYouSee")}
          value={answers.description || notSaid}
          data={Boolean(answers.description)}
          preserveLines
        />
        <Row
          term={t("summary.where")}
          value={answers.locations.length ? answers.locations.map((l) => labelFor(t, "location", l)) : notSaid}
        />
        <Row
          term={t(staff ? "summary.noticedStaff" : "summary.noticed")}
          value={answers.observations.length ? answers.observations.map((o) => labelFor(t, "observation", o)) : notSaid}
        />
        <Row
          term={t("summary.rooms")}
          value={answers.roomNames.length ? [...answers.roomNames] : notSaid}
          data={answers.roomNames.length > 0}
        />
      </SummaryCard>
      <SummaryCard title={t("summary.extentTitle")} step={1} onChange={onChange}>
        <Row term={t("summary.howLong")} value={answers.since ? labelFor(t, "duration", answers.since) : notSaid} />
        <Row term={t("summary.howBig")} value={answers.area ? labelFor(t, "area", answers.area) : notSaid} />
      </SummaryCard>
      <SummaryCard title={t(staff ? "summary.homeTitleStaff" : "summary.homeTitle")} step={2} onChange={onChange}>
        {EQUIPMENT_QUESTIONS.map((q) => {
          const answer = answers.equipment?.[q];
          const question = equipmentQuestion(t, q);
          return <Row key={q} term={question.question} value={answer ? question.answer(answer) : notSaid} />;
        })}
        <Row term={t(staff ? "summary.householdStaff" : "summary.household")} value={household} />
        <Row
          term={heatingCost.question}
          value={answers.equipment?.heatingCost ? heatingCost.answer(answers.equipment.heatingCost) : notSaid}
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
  const { t } = useTranslation("report", { i18n });
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
            {t("summary.change")}
            <span className="sr-only"> {title.toLowerCase()}</span>
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
  /** The answer is data (what someone typed, room names, a file's name), not words to translate. */
  data?: boolean;
}

/** A question and its answer inside a SummaryCard: the question small above, the answer as read. */
export function Row({ term, value, preserveLines, data }: RowProps) {
  return (
    <div className="flex flex-col gap-0.5">
      <dt className="text-sm text-ink-soft">{term}</dt>
      <dd className="font-semibold text-ink" translate={data ? "no" : undefined}>
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
