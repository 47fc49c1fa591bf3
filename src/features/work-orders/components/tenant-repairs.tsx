import { useId, useRef, useState, type FormEvent, type ReactNode } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { Textarea } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import { useVerification } from "../api/get-verification";
import { useCaseWorkOrders } from "../api/get-case-work-orders";
import { useRespondToBooking } from "../api/respond-to-booking";
import type { WorkOrder } from "../api/case-types";
import { touchesServices, WORK_TYPE_WORDS } from "../lib/words";
import { formatDateIn, todayInLondon } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import { Trans, useTranslation } from "react-i18next";
import type { TFunction } from "i18next";

// The tenant's words for their repairs live in the case page's namespace (src/locales/<lng>/case.json, "repairs").
const useRepairText = () => useTranslation("case", { i18n, keyPrefix: "repairs" });
type RepairT = TFunction<"case", "repairs">;

/** "Tuesday 8 December, in the morning (8am to 12 noon)", in the tenant's language; the year only when it is not this year. */
function slotWords(t: RepairT, lng: string, slot: { date: string; window: string }): string {
  const thisYear = slot.date.slice(0, 4) === todayInLondon().slice(0, 4);
  return t("slot", { day: formatDateIn(lng, slot.date, thisYear ? "longDayNoYear" : "longDay"), window: slot.window });
}

const workWords = (t: RepairT, type: string) => t(`work.${Object.hasOwn(WORK_TYPE_WORDS, type) ? type : "other"}`);

interface TenantRepairsProps {
  caseId: number;
  caseStatus: string;
  /** Where the tenant adds readings on the page. */
  readingsHref: string;
}

/** The repairs for the tenant's report, in plain words: what, where, when, and their answer to the appointment. */
export function TenantRepairs({ caseId, caseStatus, readingsHref }: TenantRepairsProps) {
  const { t, i18n: lang } = useRepairText();
  const orders = useCaseWorkOrders(caseId);
  const monitoring = caseStatus === "monitoring";
  const verification = useVerification(caseId, { enabled: monitoring });
  if (orders.isPending) return null;
  if (orders.isError) {
    // No repairs (or none the tenant can see) is not a problem to report.
    if (orders.error instanceof ApiError && orders.error.status === 404) return null;
    return (
      <Panel title={t("title")} id="case-repairs">
        <Alert tone="warning" title={t("loadFailed")}>
          <span translate="no">{errorMessage(orders.error)}</span>
        </Alert>
      </Panel>
    );
  }
  if (orders.data.length === 0) return null;
  const endsAt = verification.data?.monitoringEndsAt ?? null;

  return (
    <Panel title={t("title")} id="case-repairs">
      <div className="flex flex-col gap-4">
        {monitoring ? (
          <Alert
            tone="info"
            title={endsAt ? t("checkingUntil", { date: formatDateIn(lang.language, endsAt, "longDay") }) : t("checking")}
            live="none"
          >
            <p>
              <Trans t={t} i18nKey="checkingBody" components={{ add: <InPageLink href={readingsHref} /> }} />
            </p>
          </Alert>
        ) : null}
        <ul className="flex flex-col gap-4">
          {orders.data.map((o) => (
            <RepairItem key={o.id} order={o} />
          ))}
        </ul>
      </div>
    </Panel>
  );
}

function RepairItem({ order: o }: { order: WorkOrder }) {
  const headingId = useId();
  const { t, i18n: lang } = useRepairText();
  const upcoming = o.slot !== null && (o.status === "scheduled" || o.status === "confirmed" || o.status === "change-requested");
  return (
    <li aria-labelledby={headingId} className="flex flex-col gap-2 rounded-md border border-line bg-paper p-3 sm:p-4">
      <h3 id={headingId} className="text-lg font-bold">
        {workWords(t, o.type)}
      </h3>
      {o.rooms.length ? (
        <p>
          <Trans
            t={t}
            i18nKey="where"
            values={{ rooms: o.rooms.map((r) => r.name).join(", ") }}
            shouldUnescape
            components={{ rooms: <span translate="no" /> }}
          />
        </p>
      ) : null}
      {o.status === "unscheduled" ? <p>{t("willOffer")}</p> : null}
      {o.status === "cancelled" ? <p>{t("noLongerPlanned")}</p> : null}
      {o.status === "done" && o.completion ? (
        <div>
          <p className="font-semibold">{t("doneOn", { date: formatDateIn(lang.language, o.completion.at, "longDay") })}</p>
          <p className="whitespace-pre-line" translate="no">
            {o.completion.note}
          </p>
        </div>
      ) : null}
      {upcoming ? <Appointment order={o} /> : null}
      {upcoming ? <VisitNotes order={o} /> : null}
    </li>
  );
}

function Appointment({ order: o }: { order: WorkOrder }) {
  const respond = useRespondToBooking(o.caseId, o.id);
  const { t, i18n: lang } = useRepairText();
  const [asking, setAsking] = useState(false);
  const [reason, setReason] = useState("");
  const [error, setError] = useState<string | undefined>();
  const reasonRef = useRef<HTMLTextAreaElement>(null);
  const slot = slotWords(t, lang.language, o.slot!);
  const who = o.assignee?.name ?? o.contractor?.name ?? null;
  const answer = o.booking?.response ?? null;

  const askAnother = (e: FormEvent) => {
    e.preventDefault();
    const trimmed = reason.trim();
    if (trimmed.length < 3) {
      setError(t("reasonShort"));
      return reasonRef.current?.focus();
    }
    respond.mutate({ response: "another-slot", reason: trimmed }, { onSuccess: () => setAsking(false) });
  };

  const askForm = (
    <form onSubmit={askAnother} noValidate className="flex flex-col gap-3">
      <Textarea
        ref={reasonRef}
        label={t("reasonLabel")}
        hint={t("reasonHint")}
        rows={2}
        maxLength={2000}
        value={reason}
        error={error}
        onChange={(e) => {
          setReason(e.target.value);
          setError(undefined);
          respond.reset();
        }}
      />
      <div className="flex flex-wrap gap-2">
        <Button type="submit" busy={respond.isPending}>
          {t("send")}
        </Button>
        <Button variant="ghost" onClick={() => setAsking(false)} disabled={respond.isPending}>
          {t("back")}
        </Button>
      </div>
    </form>
  );

  const failure = respond.isError ? (
    <Alert tone="danger" title={t("notSent")}>
      <span translate="no">{errorMessage(respond.error)}</span>
    </Alert>
  ) : null;

  if (answer === "change-requested") {
    return (
      <Alert tone="info" title={t("askedTitle")} live="none">
        {o.booking?.reason ? (
          <p>
            <Trans
              t={t}
              i18nKey="youSaid"
              values={{ reason: o.booking.reason }}
              shouldUnescape
              components={{ said: <span translate="no" /> }}
            />
          </p>
        ) : null}
        <p>{t("willOfferNew")}</p>
      </Alert>
    );
  }

  if (answer === "confirmed") {
    return (
      <div className="flex flex-col gap-2">
        <Alert tone="success" title={t("confirmedTitle")} live="none">
          <p>
            {t("confirmedSlot", { slot: slot.charAt(0).toLocaleUpperCase() + slot.slice(1) })}
            {who ? (
              <>
                {" "}
                <Who t={t} who={who} />
              </>
            ) : null}
          </p>
          <p>{t("landlordTold")}</p>
        </Alert>
        {asking ? (
          askForm
        ) : (
          <div>
            <Button variant="secondary" size="sm" onClick={() => setAsking(true)}>
              {t("noLongerSuits")}
            </Button>
          </div>
        )}
        {failure}
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-3">
      <p className="font-semibold">{t("offer", { slot })}</p>
      {who ? (
        <p>
          <Who t={t} who={who} />
        </p>
      ) : null}
      {asking ? (
        askForm
      ) : (
        <div className="flex flex-wrap gap-2">
          <Button busy={respond.isPending} onClick={() => respond.mutate({ response: "confirm" })}>
            {t("confirm")}
          </Button>
          <Button variant="secondary" onClick={() => setAsking(true)} disabled={respond.isPending}>
            {t("askAnother")}
          </Button>
        </div>
      )}
      {failure}
    </div>
  );
}

/** The usual notes for a visit: short, practical, and never blaming. */
function VisitNotes({ order: o }: { order: WorkOrder }) {
  const { t } = useRepairText();
  return (
    <div className="text-sm">
      <p className="font-semibold">{t("visitTitle")}</p>
      <ul className="mt-1 list-disc space-y-1 pl-5">
        <li>{t("visitId")}</li>
        <li>{t("visitChildren")}</li>
        {touchesServices(o.type) ? <li>{t("visitServices")}</li> : null}
        {o.type === "mould-wash" ? <li>{t("visitWindow")}</li> : null}
      </ul>
    </div>
  );
}

/** "Sam Price will come.": the name is data, kept out of translation. */
function Who({ t, who }: { t: RepairT; who: string }) {
  return <Trans t={t} i18nKey="whoWillCome" values={{ who }} shouldUnescape components={{ who: <span translate="no" /> }} />;
}

/** A link whose words come from the translation (Trans fills in its children). */
function InPageLink({ href, children }: { href: string; children?: ReactNode }) {
  return <a href={href}>{children}</a>;
}
