import { useQueryClient, type QueryClient } from "@tanstack/react-query";
import { useEffect, useRef, useState, type ReactNode, type RefObject } from "react";
import { Link, useLocation, useNavigate, useParams, type LoaderFunctionArgs } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { CollapsibleSection } from "@/components/ui/collapsible-section";
import { LoadingState } from "@/components/ui/spinner";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { caseKeys } from "@/lib/query-keys";
import { caseQueryOptions, useCase } from "@/features/cases/api/get-case";
import { caseEvaluationQueryOptions, useCaseEvaluation } from "@/features/cases/api/get-case-evaluation";
import { caseEventsQueryOptions, useCaseEvents } from "@/features/cases/api/get-case-events";
import { useCasePhotos } from "@/features/cases/api/get-case-photos";
import { useCaseReadings } from "@/features/cases/api/get-case-readings";
import { caseTitle, type CaseDto } from "@/features/cases/api/types";
import { CaseEvaluationView } from "@/features/cases/components/case-evaluation";
import { StatusBadge } from "@/features/cases/components/case-status";
import { CaseTimeline } from "@/features/cases/components/case-timeline";
import { PhotoGallery } from "@/features/cases/components/photo-gallery";
import { ReadingsSection } from "@/features/cases/components/readings-section";
import { WorseButton } from "@/features/cases/components/worse-dialog";
import { useCaseText, usePhotoGalleryWords, useTenantStage, useTimelineWords } from "@/features/cases/tenant-words";
import { TenantRepairs } from "@/features/work-orders/components/tenant-repairs";
import { HomeAdviceSection } from "@/features/home-advice/components/home-advice-section";
import { OPEN_CASE_STATUSES } from "@/lib/domain/case-workflow";
import { TextLink } from "@/components/ui/text-link";
import { LandlordMessages } from "@/features/cases/components/landlord-messages";
import { CaseConversation } from "@/features/conversation/components/case-conversation";
import { useConversationWords } from "@/features/conversation/tenant-words";
import { TenantComplaintSection } from "@/features/complaints/components/tenant-complaint-section";
import { AddPhotos } from "@/features/report/components/add-photos";
import { AddReadings } from "@/features/report/components/add-readings";
import { ReportFollowUp } from "@/features/report/components/report-follow-up";
import { ReportSummary } from "@/features/report/components/report-summary";
import { ApiError, errorMessage } from "@/lib/api-client";
import { formatDateIn } from "@/lib/dates";
import { Trans } from "react-i18next";

const caseIdOf = (raw: string | undefined): number | null => {
  const id = Number(raw);
  return Number.isInteger(id) && id > 0 ? id : null;
};

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = caseIdOf(params.id);
    if (id !== null && (await signedInAs(queryClient, ["tenant"]))) {
      void queryClient.prefetchQuery(caseQueryOptions(id));
      void queryClient.prefetchQuery(caseEventsQueryOptions(id));
      void queryClient.prefetchQuery(caseEvaluationQueryOptions(id));
    }
    return null;
  };

function justSentFrom(state: unknown): { complete: boolean } | null {
  if (typeof state !== "object" || state === null || (state as { justSent?: unknown }).justSent !== true) return null;
  return { complete: (state as { complete?: unknown }).complete !== false };
}

export default function CasePage() {
  const id = caseIdOf(useParams().id);
  if (id === null) return <CaseNotFound />;
  return <CaseView id={id} />;
}

function CaseNotFound({ message }: { message?: string }) {
  const { t } = useCaseText();
  return (
    <>
      <title>{t("notFound.title")}</title>
      <PageHeader title={t("notFound.heading")} />
      <Alert tone="info" title={t("notFound.alert")}>
        {/* The server's own words, when it gave a reason, are not translated. */}
        {message ? <p translate="no">{message}</p> : <p>{t("notFound.body")}</p>}
        <p className="mt-1">
          <Link to="/cases">{t("notFound.myReports")}</Link>
        </p>
      </Alert>
    </>
  );
}

function CaseView({ id }: { id: number }) {
  const { t, i18n } = useCaseText();
  const queryClient = useQueryClient();
  const location = useLocation();
  const navigate = useNavigate();
  const [justSent] = useState(() => justSentFrom(location.state));
  // The thanks are for this visit only: a reload or a later visit shows the case plainly.
  useEffect(() => {
    if (justSentFrom(location.state)) navigate(location.pathname, { replace: true, state: null });
  }, [location.state, location.pathname, navigate]);
  const kase = useCase(id);
  // The tenant's stage moves with the work: the written summary shows once it has been sent.
  const summarySent = useCaseEvents(id).data?.some((e) => e.type === "summary-sent") ?? false;
  const refresh = () => void queryClient.invalidateQueries({ queryKey: caseKeys.detail(id) });
  const hash = location.hash;
  const stage = useTenantStage(kase.data?.status ?? "", { summarySent });

  if (kase.isPending) return <LoadingState>{t("loading")}</LoadingState>;
  if (kase.isError) {
    if (kase.error instanceof ApiError && kase.error.status === 404) return <CaseNotFound message={kase.error.message} />;
    return (
      <>
        <title>{t("loadFailed.title")}</title>
        <PageHeader title={t("loadFailed.heading")} />
        <Alert tone="danger" title={t("loadFailed.alert")}>
          <span translate="no">{errorMessage(kase.error)}</span>
        </Alert>
      </>
    );
  }
  const c = kase.data;
  const title = caseTitle(c);

  return (
    <>
      <title>{t("pageTitle", { title })}</title>
      <PageHeader
        title={<span translate="no">{title}</span>}
        description={
          <span className="flex flex-col gap-1">
            <StatusBadge status={c.status} label={stage.label} prefix={t("status.prefix")} />
            <span>
              {t("sentOn", { date: formatDateIn(i18n.language, c.createdAt) })}
              {c.property.addressLine1 ? (
                <>
                  {" · "}
                  <span translate="no">{c.property.addressLine1}</span>
                </>
              ) : null}
            </span>
          </span>
        }
      />
      <div className="flex flex-col gap-5">
        {justSent ? (
          <Alert tone="success" title={t("thanks.title")}>
            <p>
              <Trans
                t={t}
                i18nKey="thanks.body"
                values={{ reference: title }}
                components={{ strong: <strong translate="no" /> }}
              />
              {justSent.complete ? "" : ` ${t("thanks.incomplete")}`}
            </p>
          </Alert>
        ) : null}
        <ReportFollowUp caseId={id} rooms={c.homeRooms} onChanged={refresh} />
        <NextSteps c={c} summarySent={summarySent} onChanged={refresh} />
        {OPEN_CASE_STATUSES.includes(c.status) ? (
          <HomeAdviceSection caseId={id} open={Boolean(justSent) || hash === "#case-advice"} />
        ) : null}
        <TenantRepairs caseId={id} caseStatus={c.status} readingsHref="#case-next" />
        <MessagesPanel id={id} open={hash === "#case-messages"} />
        {/* The rest, one press away under plain headings; a link to a section (#case-readings) opens it. */}
        <EvaluationPanel id={id} open={Boolean(justSent) || hash === "#case-evaluation"} />
        <ReadingsPanel c={c} open={hash === "#case-readings"} />
        <PhotosPanel id={id} open={hash === "#case-photos"} />
        <TimelinePanel c={c} open={hash === "#case-timeline"} />
        <CollapsibleSection id="case-complaint" title={t("sections.complaint.title")} defaultOpen={hash === "#case-complaint"}>
          <TenantComplaintSection caseId={id} />
        </CollapsibleSection>
        <CollapsibleSection id="case-answers" title={t("sections.answers.title")} defaultOpen={hash === "#case-answers"}>
          <ReportSummary
            sentAt={c.createdAt}
            answers={{
              description: c.description,
              locations: c.locations,
              observations: c.observations,
              roomNames: c.rooms.map((r) => r.name),
              since: c.since,
              area: c.area,
              vulnerability: c.vulnerability,
              equipment: c.equipment,
            }}
          />
        </CollapsibleSection>
      </div>
    </>
  );
}

type Action = "photos" | "readings" | null;

function NextSteps({ c, summarySent, onChanged }: { c: CaseDto; summarySent: boolean; onChanged: () => void }) {
  const [open, setOpen] = useState<Action>(null);
  const actionRef = useRef<HTMLHeadingElement>(null);
  const photosButton = useRef<HTMLButtonElement>(null);
  const readingsButton = useRef<HTMLButtonElement>(null);
  // Focus goes back to the button that opened the panel.
  const close = () => {
    (open === "photos" ? photosButton : readingsButton).current?.focus();
    setOpen(null);
  };
  useEffect(() => {
    if (open) actionRef.current?.focus();
  }, [open]);
  const toggle = (action: Exclude<Action, null>) => setOpen((current) => (current === action ? null : action));
  const { t } = useCaseText();
  const meaning = useTenantStage(c.status, { summarySent }).meaning;

  return (
    <>
      <Panel title={t("next.title")} id="case-next">
        {meaning ? <p>{meaning}</p> : null}
        <p className="mt-2">{t("next.addAnyTime")}</p>
        <div className="mt-3 flex flex-wrap gap-2">
          <Button
            ref={photosButton}
            variant="secondary"
            aria-expanded={open === "photos"}
            aria-controls="case-add-photos"
            onClick={() => toggle("photos")}
          >
            {t("next.addPhotos")}
          </Button>
          <Button
            ref={readingsButton}
            variant="secondary"
            aria-expanded={open === "readings"}
            aria-controls="case-add-readings"
            onClick={() => toggle("readings")}
          >
            {t("next.addReadings")}
          </Button>
          <WorseButton caseId={c.id} onReported={onChanged} />
        </div>
      </Panel>
      {open === "photos" ? (
        <ActionPanel id="case-add-photos" title={t("next.morePhotos")} headingRef={actionRef} onClose={close}>
          <AddPhotos caseId={c.id} onAdded={onChanged} />
        </ActionPanel>
      ) : null}
      {open === "readings" ? (
        <ActionPanel id="case-add-readings" title={t("next.moreReadings")} headingRef={actionRef} onClose={close}>
          <AddReadings caseId={c.id} rooms={c.homeRooms} onAdded={onChanged} headingLevel={3} />
        </ActionPanel>
      ) : null}
    </>
  );
}

interface ActionPanelProps {
  id: string;
  title: string;
  headingRef: RefObject<HTMLHeadingElement | null>;
  onClose: () => void;
  children: ReactNode;
}

function ActionPanel({ id, title, headingRef, onClose, children }: ActionPanelProps) {
  const { t } = useCaseText();
  return (
    <section
      id={id}
      aria-labelledby={`${id}-heading`}
      className="flex flex-col gap-4 rounded-lg border-2 border-dew-600 bg-surface p-4 shadow-card sm:p-5"
    >
      <div className="flex flex-wrap items-center justify-between gap-2">
        <h2 id={`${id}-heading`} ref={headingRef} tabIndex={-1} className="text-xl font-bold focus:outline-none">
          {title}
        </h2>
        <Button variant="ghost" size="sm" onClick={onClose}>
          <Trans
            t={t}
            i18nKey="next.closeWhat"
            values={{ what: title.toLocaleLowerCase() }}
            components={{ hidden: <span className="sr-only" /> }}
          />
        </Button>
      </div>
      {children}
    </section>
  );
}

function EvaluationPanel({ id, open }: { id: number; open: boolean }) {
  const evaluation = useCaseEvaluation(id);
  const { t } = useCaseText();
  return (
    <CollapsibleSection
      id="case-evaluation"
      title={t("sections.evaluation.title")}
      summary={t("sections.evaluation.summary")}
      defaultOpen={open}
    >
      {evaluation.isPending ? (
        <LoadingState>{t("sections.evaluation.loading")}</LoadingState>
      ) : evaluation.isError ? (
        <Alert tone="warning" title={t("sections.evaluation.failed")}>
          <span translate="no">{errorMessage(evaluation.error)}</span>
        </Alert>
      ) : (
        <CaseEvaluationView evaluation={evaluation.data} emptyHint={t("sections.evaluation.emptyHint")} />
      )}
    </CollapsibleSection>
  );
}

/**
 * The latest message or letter (the written summary) from the landlord first, earlier ones on request;
 * then the conversation, where the tenant writes back.
 */
function MessagesPanel({ id, open }: { id: number; open: boolean }) {
  const events = useCaseEvents(id);
  const { t } = useCaseText();
  const conversationWords = useConversationWords();
  return (
    <>
      <Panel title={t("sections.latest.title")} id="case-latest">
        {events.isPending ? (
          <LoadingState>{t("sections.latest.loading")}</LoadingState>
        ) : events.isError ? (
          <Alert tone="warning">
            <span translate="no">{errorMessage(events.error)}</span>
          </Alert>
        ) : (
          <LandlordMessages events={events.data} showFirst={1} />
        )}
        <p className="mt-3">
          <TextLink to={{ hash: "case-messages" }}>{t("sections.latest.write")}</TextLink>
        </p>
      </Panel>
      <CollapsibleSection
        id="case-messages"
        title={t("sections.messages.title")}
        summary={t("sections.messages.summary")}
        defaultOpen={open}
      >
        <CaseConversation caseId={id} viewer="tenant" words={conversationWords} />
      </CollapsibleSection>
    </>
  );
}

function TimelinePanel({ c, open }: { c: CaseDto; open: boolean }) {
  const events = useCaseEvents(c.id);
  const { t } = useCaseText();
  const timelineWords = useTimelineWords();
  return (
    <CollapsibleSection
      id="case-timeline"
      title={t("sections.timeline.title")}
      summary={t("sections.timeline.summary")}
      defaultOpen={open}
    >
      {events.isPending ? (
        <LoadingState>{t("sections.timeline.loading")}</LoadingState>
      ) : events.isError ? (
        <Alert tone="warning">
          <span translate="no">{errorMessage(events.error)}</span>
        </Alert>
      ) : (
        <CaseTimeline events={events.data} rooms={c.homeRooms} words={timelineWords} />
      )}
    </CollapsibleSection>
  );
}

function PhotosPanel({ id, open }: { id: number; open: boolean }) {
  const photos = useCasePhotos(id);
  const count = photos.data?.length;
  const { t } = useCaseText();
  const galleryWords = usePhotoGalleryWords();
  return (
    <CollapsibleSection
      id="case-photos"
      title={t("sections.photos.title")}
      summary={count === undefined ? undefined : t("sections.photos.summary", { count })}
      defaultOpen={open}
    >
      {photos.isPending ? (
        <LoadingState>{t("sections.photos.loading")}</LoadingState>
      ) : photos.isError ? (
        <Alert tone="warning">
          <span translate="no">{errorMessage(photos.error)}</span>
        </Alert>
      ) : (
        <PhotoGallery photos={photos.data} emptyText={t("sections.photos.empty")} words={galleryWords} />
      )}
    </CollapsibleSection>
  );
}

function ReadingsPanel({ c, open }: { c: CaseDto; open: boolean }) {
  const readings = useCaseReadings(c.id);
  const count = readings.data?.length;
  const { t } = useCaseText();
  return (
    <CollapsibleSection
      id="case-readings"
      title={t("sections.readings.title")}
      summary={count === undefined ? undefined : t("sections.readings.summary", { count })}
      defaultOpen={open}
    >
      {readings.isPending ? (
        <LoadingState>{t("sections.readings.loading")}</LoadingState>
      ) : readings.isError ? (
        <Alert tone="warning">
          <span translate="no">{errorMessage(readings.error)}</span>
        </Alert>
      ) : (
        <ReadingsSection readings={readings.data} rooms={c.homeRooms} />
      )}
    </CollapsibleSection>
  );
}
