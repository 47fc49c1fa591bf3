import { useTranslation } from "react-i18next";
import { Link } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { buttonClasses } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { useFormatDate } from "@/lib/i18n/use-format-date";
import { useMyCases } from "../api/get-my-cases";
import { caseTitle, type CaseDto } from "../api/types";
import { StatusBadge } from "./case-status";

export const REPORT_PATH = "/report";

interface CaseListProps {
  cases: readonly CaseDto[];
  headingLevel?: 2 | 3;
}

export function CaseList({ cases, headingLevel = 2 }: CaseListProps) {
  const { t } = useTranslation("home");
  const formatDate = useFormatDate();
  const Heading = headingLevel === 2 ? "h2" : "h3";
  return (
    <ul className="flex flex-col gap-3">
      {cases.map((c) => {
        const rooms = c.rooms.map((r) => r.name);
        return (
          <li
            key={c.id}
            className="relative flex flex-col gap-2 rounded-lg border border-line bg-surface p-4 shadow-card hover:border-dew-700"
          >
            <div className="flex flex-wrap items-center justify-between gap-2">
              <Heading className="text-lg font-bold">
                {/* The whole card is the link's target area; the link text is the reference. */}
                <Link
                  to={`/cases/${c.id}`}
                  className="text-dew-700 underline decoration-2 after:absolute after:inset-0 hover:text-dew-900"
                >
                  <span translate="no">{caseTitle(c)}</span>
                </Link>
              </Heading>
              <StatusBadge
                status={c.status}
                label={t(`status.${c.status}`, { defaultValue: "" }) || undefined}
                prefix={`${t("reports.status")} `}
              />
            </div>
            <dl className="grid grid-cols-1 gap-x-4 gap-y-1 text-sm sm:grid-cols-2">
              <div>
                <dt className="inline font-semibold text-ink-soft">{t("reports.sentOn")} </dt>
                <dd className="inline">{formatDate(c.createdAt)}</dd>
              </div>
              <div>
                <dt className="inline font-semibold text-ink-soft">{t("reports.rooms", { count: rooms.length })} </dt>
                {rooms.length ? (
                  <dd className="inline" translate="no">
                    {rooms.join(", ")}
                  </dd>
                ) : (
                  <dd className="inline">{t("reports.notGiven")}</dd>
                )}
              </div>
            </dl>
            <div className="flex items-start gap-3">
              {c.thumbnailUrl ? (
                <img
                  src={c.thumbnailUrl}
                  alt={t("reports.photoAlt", { title: caseTitle(c) })}
                  className="h-16 w-16 shrink-0 rounded-md border border-line object-cover"
                  loading="lazy"
                />
              ) : null}
              <div className="flex flex-col gap-1">
                {c.description ? (
                  <p className="line-clamp-2 text-ink-soft" translate="no">
                    {c.description}
                  </p>
                ) : null}
                {c.photoCount ? <p className="text-sm text-ink-soft">{t("reports.photos", { count: c.photoCount })}</p> : null}
              </div>
            </div>
          </li>
        );
      })}
    </ul>
  );
}

interface MyCasesProps {
  /** Show only the newest few (My home); the full list otherwise. */
  limit?: number;
  headingLevel?: 2 | 3;
  /** The empty state offers a report button, unless the page already has one. */
  emptyAction?: boolean;
}

/** The tenant's reports, newest first, with kind empty and error states. */
export function MyCases({ limit, headingLevel = 2, emptyAction = true }: MyCasesProps) {
  const cases = useMyCases();
  const { t } = useTranslation("home");
  if (cases.isPending) return <LoadingState>{t("reports.loading")}</LoadingState>;
  if (cases.isError)
    return (
      <Alert tone="warning" title={t("reports.loadError")}>
        {errorMessage(cases.error)}
      </Alert>
    );
  if (cases.data.length === 0)
    return (
      <EmptyState
        title={t("reports.none")}
        action={
          emptyAction ? (
            <Link to={REPORT_PATH} className={buttonClasses("primary", "lg")}>
              {t("reports.report")}
            </Link>
          ) : undefined
        }
      >
        {t("reports.noneText")}
      </EmptyState>
    );
  const shown = limit ? cases.data.slice(0, limit) : cases.data;
  return (
    <div className="flex flex-col gap-3">
      <CaseList cases={shown} headingLevel={headingLevel} />
      {limit && cases.data.length > limit ? (
        <p>
          <Link to="/cases" className="font-semibold text-dew-700 underline decoration-2">
            {t("reports.seeAll", { count: cases.data.length })}
          </Link>
        </p>
      ) : null}
    </div>
  );
}
