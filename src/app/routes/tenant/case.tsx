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
import { tenantStage } from "@/features/cases/labels";
import { TenantRepairs } from "@/features/work-orders/components/tenant-repairs";
import { HomeAdviceSection } from "@/features/home-advice/components/home-advice-section";
import { OPEN_CASE_STATUSES } from "@/lib/domain/case-workflow";
import { TextLink } from "@/components/ui/text-link";
import { LandlordMessages } from "@/features/cases/components/landlord-messages";
import { CaseConversation } from "@/features/conversation/components/case-conversation";
import { TenantComplaintSection } from "@/features/complaints/components/tenant-complaint-section";
import { AddPhotos } from "@/features/report/components/add-photos";
import { AddReadings } from "@/features/report/components/add-readings";
import { ReportFollowUp } from "@/features/report/components/report-follow-up";
import { ReportSummary } from "@/features/report/components/report-summary";
import { ApiError, errorMessage } from "@/lib/api-client";
import { formatDate } from "@/lib/dates";

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
  return (
    <>
      <title>Report not found · Dewline</title>
      <PageHeader title="Report not found" />
      <Alert tone="info" title="We couldn't find this report">
        <p>{message ?? "The link may be wrong, or the report may belong to another account."}</p>
        <p className="mt-1">
          <Link to="/cases">Go to My reports</Link>
        </p>
      </Alert>
    </>
  );
}

function CaseView({ id }: { id: number }) {
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

  if (kase.isPending) return <LoadingState>Loading your report…</LoadingState>;
  if (kase.isError) {
    if (kase.error instanceof ApiError && kase.error.status === 404) return <CaseNotFound message={kase.error.message} />;
    return (
      <>
        <title>Report · Dewline</title>
        <PageHeader title="Your report" />
        <Alert tone="danger" title="We couldn't load this report">
          {errorMessage(kase.error)}
        </Alert>
      </>
    );
  }
  const c = kase.data;
  const title = caseTitle(c);

  return (
    <>
      <title>{`${title} · Dewline`}</title>
      <PageHeader
        title={title}
        description={
          <span className="flex flex-col gap-1">
            <StatusBadge status={c.status} facts={{ summarySent }} />
            <span>
              Sent on {formatDate(c.createdAt)}
              {c.property.addressLine1 ? ` · ${c.property.addressLine1}` : ""}
            </span>
          </span>
        }
      />
      <div className="flex flex-col gap-5">
        {justSent ? (
          <Alert tone="success" title="Thank you. Your report has been sent">
            <p>
              Your reference is <strong>{title}</strong>. Your landlord has been told and will look into it.
              {justSent.complete ? "" : " One part still needs your help, just below."}
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
        <CollapsibleSection id="case-complaint" title="Complaint" defaultOpen={hash === "#case-complaint"}>
          <TenantComplaintSection caseId={id} />
        </CollapsibleSection>
        <CollapsibleSection id="case-answers" title="What you told us" defaultOpen={hash === "#case-answers"}>
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
  const meaning = tenantStage(c.status, { summarySent }).meaning;

  return (
    <>
      <Panel title="What happens next" id="case-next">
        {meaning ? <p>{meaning}</p> : null}
        <p className="mt-2">You can add to your report at any time.</p>
        <div className="mt-3 flex flex-wrap gap-2">
          <Button
            ref={photosButton}
            variant="secondary"
            aria-expanded={open === "photos"}
            aria-controls="case-add-photos"
            onClick={() => toggle("photos")}
          >
            Add photos
          </Button>
          <Button
            ref={readingsButton}
            variant="secondary"
            aria-expanded={open === "readings"}
            aria-controls="case-add-readings"
            onClick={() => toggle("readings")}
          >
            Add readings
          </Button>
          <WorseButton caseId={c.id} onReported={onChanged} />
        </div>
      </Panel>
      {open === "photos" ? (
        <ActionPanel id="case-add-photos" title="Add more photos" headingRef={actionRef} onClose={close}>
          <AddPhotos caseId={c.id} onAdded={onChanged} />
        </ActionPanel>
      ) : null}
      {open === "readings" ? (
        <ActionPanel id="case-add-readings" title="Add more readings" headingRef={actionRef} onClose={close}>
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
          Close<span className="sr-only"> {title.toLowerCase()}</span>
        </Button>
      </div>
      {children}
    </section>
  );
}

function EvaluationPanel({ id, open }: { id: number; open: boolean }) {
  const evaluation = useCaseEvaluation(id);
  return (
    <CollapsibleSection
      id="case-evaluation"
      title="What your readings show"
      summary="What the readings say about condensation and mould, with advice on staying safe."
      defaultOpen={open}
    >
      {evaluation.isPending ? (
        <LoadingState>Working out what the readings show…</LoadingState>
      ) : evaluation.isError ? (
        <Alert tone="warning" title="We couldn't work out the readings just now">
          {errorMessage(evaluation.error)}
        </Alert>
      ) : (
        <CaseEvaluationView evaluation={evaluation.data} emptyHint="you can add some with “Add readings” above." />
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
  return (
    <>
      <Panel title="Latest from your landlord" id="case-latest">
        {events.isPending ? (
          <LoadingState>Loading messages…</LoadingState>
        ) : events.isError ? (
          <Alert tone="warning">{errorMessage(events.error)}</Alert>
        ) : (
          <LandlordMessages events={events.data} showFirst={1} />
        )}
        <p className="mt-3">
          <TextLink to={{ hash: "case-messages" }}>Write to your landlord</TextLink>
        </p>
      </Panel>
      <CollapsibleSection
        id="case-messages"
        title="Messages with your landlord"
        summary="Write to your landlord, with photos if you like, and read every message."
        defaultOpen={open}
      >
        <CaseConversation caseId={id} viewer="tenant" />
      </CollapsibleSection>
    </>
  );
}

function TimelinePanel({ c, open }: { c: CaseDto; open: boolean }) {
  const events = useCaseEvents(c.id);
  return (
    <CollapsibleSection
      id="case-timeline"
      title="What has happened so far"
      summary="Every step of your report, newest first."
      defaultOpen={open}
    >
      {events.isPending ? (
        <LoadingState>Loading what has happened…</LoadingState>
      ) : events.isError ? (
        <Alert tone="warning">{errorMessage(events.error)}</Alert>
      ) : (
        <CaseTimeline events={events.data} rooms={c.homeRooms} />
      )}
    </CollapsibleSection>
  );
}

function PhotosPanel({ id, open }: { id: number; open: boolean }) {
  const photos = useCasePhotos(id);
  const count = photos.data?.length;
  return (
    <CollapsibleSection
      id="case-photos"
      title="Photos"
      summary={count === undefined ? undefined : count === 0 ? "No photos yet." : count === 1 ? "1 photo." : `${count} photos.`}
      defaultOpen={open}
    >
      {photos.isPending ? (
        <LoadingState>Loading photos…</LoadingState>
      ) : photos.isError ? (
        <Alert tone="warning">{errorMessage(photos.error)}</Alert>
      ) : (
        <PhotoGallery photos={photos.data} emptyText="No photos yet" />
      )}
    </CollapsibleSection>
  );
}

function ReadingsPanel({ c, open }: { c: CaseDto; open: boolean }) {
  const readings = useCaseReadings(c.id);
  const count = readings.data?.length;
  return (
    <CollapsibleSection
      id="case-readings"
      title="Readings"
      summary={
        count === undefined
          ? undefined
          : count === 0
            ? "No readings yet."
            : `${count.toLocaleString("en-GB")} ${count === 1 ? "reading" : "readings"}, with a chart.`
      }
      defaultOpen={open}
    >
      {readings.isPending ? (
        <LoadingState>Loading readings…</LoadingState>
      ) : readings.isError ? (
        <Alert tone="warning">{errorMessage(readings.error)}</Alert>
      ) : (
        <ReadingsSection readings={readings.data} rooms={c.homeRooms} />
      )}
    </CollapsibleSection>
  );
}
