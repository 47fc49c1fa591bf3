import { useQueryClient, type QueryClient } from "@tanstack/react-query";
import { useMemo, type ReactNode } from "react";
import { Link, useParams, useSearchParams, type LoaderFunctionArgs } from "react-router-dom";
import { channelLabels, labelFor } from "@/lib/labels";
import { STATE_LABELS } from "@/lib/surface-state-labels";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { HomeAdviceSection } from "@/features/home-advice/components/home-advice-section";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingState } from "@/components/ui/spinner";
import { useUser } from "@/features/auth/api/get-me";
import { signedInAs } from "@/features/auth/api/require-role";
import { roleHome } from "@/features/auth/roles";
import { caseKeys } from "@/lib/query-keys";
import { caseQueryOptions, useCase } from "@/features/cases/api/get-case";
import { caseEvaluationQueryOptions, useCaseEvaluation } from "@/features/cases/api/get-case-evaluation";
import { caseEventsQueryOptions, useCaseEvents } from "@/features/cases/api/get-case-events";
import { useCasePhotos } from "@/features/cases/api/get-case-photos";
import { useCaseReadings } from "@/features/cases/api/get-case-readings";
import type { CaseDto } from "@/features/cases/api/types";
import { CaseEvaluationView } from "@/features/cases/components/case-evaluation";
import { StatusBadge } from "@/features/cases/components/case-status";
import { CaseTimeline } from "@/features/cases/components/case-timeline";
import { PhotoGallery } from "@/features/cases/components/photo-gallery";
import { ReadingsSection } from "@/features/cases/components/readings-section";
import { statusLabelFor } from "@/features/cases/labels";
import { deadlinesQueryOptions, useDeadlines } from "@/features/case-workspace/api/get-deadlines";
import { caseWorkOrdersQueryOptions } from "@/features/work-orders/api/get-case-work-orders";
import { useUploadWorkOrderPhotos } from "@/features/work-orders/api/upload-work-order-photos";
import { ResendEmailButton } from "@/features/outbox/components/resend-email-button";
import { NewWorkOrderForm } from "@/features/work-orders/components/new-work-order-form";
import { VerificationSection } from "@/features/work-orders/components/verification-section";
import { WorkOrderList } from "@/features/work-orders/components/work-order-list";
import { useStaff } from "@/lib/staff";
import { triageQueryOptions } from "@/features/case-workspace/api/get-triage";
import { ActionsPanel } from "@/features/case-workspace/components/actions-panel";
import { AssessmentForm, AssessmentVersions } from "@/features/case-workspace/components/assessment-section";
import { CaseHeader, staffName, workspaceTitle } from "@/features/case-workspace/components/case-header";
import { DeadlinesPanel } from "@/features/case-workspace/components/deadlines-panel";
import { StaffComplaintPanel } from "@/features/complaints/components/staff-complaint-panel";
import { usePolicy } from "@/features/policy/api/get-policy";
import { DiagnosisHints } from "@/features/case-workspace/components/diagnosis-hints";
import { InspectionForm, InspectionList } from "@/features/case-workspace/components/inspection-section";
import { CaseConversation } from "@/features/conversation/components/case-conversation";
import { DownloadEvidencePack } from "@/features/evidence-pack/components/download-evidence-pack";
import { OnDemand } from "@/features/case-workspace/components/on-demand";
import { WorkspaceTabs } from "@/features/case-workspace/components/workspace-tabs";
import { worstSurfaceState } from "@/features/case-workspace/lib/risk";
import { QueryState } from "@/features/case-workspace/components/query-state";
import { RelatedCases } from "@/features/case-workspace/components/related-cases";
import { SummarySection } from "@/features/case-workspace/components/summary-section";
import { TriagePanel } from "@/features/case-workspace/components/triage-panel";
import { useUploadPhotos } from "@/features/report/api/upload-photos";
import { PhotoUploadForm } from "@/features/report/components/add-photos";
import { ReportSummary } from "@/features/report/components/report-summary";
import { ApiError, errorMessage } from "@/lib/api-client";
import { roleLabels, STAFF_ROLES, type Role } from "@/lib/roles";

const caseIdOf = (raw: string | undefined): number | null => {
  const id = Number(raw);
  return Number.isInteger(id) && id > 0 ? id : null;
};

/** Officers and administrators change a case; maintenance leads read it (and may write messages). */
const canAct = (role: Role) => role === "officer" || role === "admin";
/** Officers, maintenance leads and administrators order works; maintenance leads and administrators book, complete and verify them. */
const canOrderWorks = (role: Role) => role === "officer" || role === "maintenance" || role === "admin";
const canManageWorks = (role: Role) => role === "maintenance" || role === "admin";

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = caseIdOf(params.id);
    if (id !== null && (await signedInAs(queryClient, STAFF_ROLES))) {
      void queryClient.prefetchQuery(caseQueryOptions(id));
      void queryClient.prefetchQuery(caseEventsQueryOptions(id));
      void queryClient.prefetchQuery(deadlinesQueryOptions(id));
      void queryClient.prefetchQuery(triageQueryOptions(id));
      void queryClient.prefetchQuery(caseEvaluationQueryOptions(id));
      void queryClient.prefetchQuery(caseWorkOrdersQueryOptions(id));
    }
    return null;
  };

const StaffStatusBadge = ({ status }: { status: string }) => <StatusBadge status={status} audience="staff" />;

export default function StaffCasePage() {
  const id = caseIdOf(useParams().id);
  if (id === null) return <CaseNotFound />;
  return <Workspace id={id} />;
}

function CaseNotFound({ message }: { message?: string }) {
  const user = useUser();
  const home = roleHome(user.role);
  return (
    <>
      <title>Case not found · Dewline</title>
      <PageHeader title="Case not found" />
      <Alert tone="info" title="We couldn't find this case">
        <p>{message ?? "The link may be wrong, or the case may belong to another landlord."}</p>
        <p className="mt-1">
          <Link to={home.path}>Go to {home.label}</Link>
        </p>
      </Alert>
    </>
  );
}

/** The workspace's tabs, in the order the work usually goes; the chosen one is in the link (?tab=…). */
const TABS = [
  ["overview", "Overview"],
  ["readings", "Readings"],
  ["inspection", "Inspection and assessment"],
  ["letters", "Letters and messages"],
  ["works", "Works"],
  ["timeline", "Timeline"],
] as const;
type TabId = (typeof TABS)[number][0];
const isTab = (value: string | null): value is TabId => TABS.some(([id]) => id === value);

function Workspace({ id }: { id: number }) {
  const user = useUser();
  const kase = useCase(id);
  const staff = useStaff();
  const policy = usePolicy();
  const evaluation = useCaseEvaluation(id);
  const [searchParams, setSearchParams] = useSearchParams();
  const requested = searchParams.get("tab");
  const tab: TabId = isTab(requested) ? requested : "overview";
  const nameOf = useMemo(
    () => (userId: number) => (userId === user.id ? `${user.name} (you)` : staffName(staff.data, userId)),
    [staff.data, user],
  );
  const sender = useMemo(() => ({ name: user.name, role: roleLabels[user.role] }), [user.name, user.role]);

  if (kase.isPending) return <LoadingState>Loading the case…</LoadingState>;
  if (kase.isError) {
    if (kase.error instanceof ApiError && kase.error.status === 404) return <CaseNotFound message={kase.error.message} />;
    return (
      <>
        <title>Case · Dewline</title>
        <PageHeader title="Case" />
        <Alert tone="danger" title="We couldn't load this case">
          {errorMessage(kase.error)}
        </Alert>
      </>
    );
  }
  const c = kase.data;
  const officer = canAct(user.role);
  const worst = evaluation.data ? worstSurfaceState(evaluation.data) : null;
  const chooseTab = (next: TabId) =>
    setSearchParams(
      (prev) => {
        const params = new URLSearchParams(prev);
        if (next === "overview") params.delete("tab");
        else params.set("tab", next);
        return params;
      },
      { replace: true },
    );

  const content: Record<TabId, ReactNode> = {
    overview: (
      <>
        <div className="grid grid-cols-1 items-start gap-5 xl:grid-cols-2">
          <div className="flex min-w-0 flex-col gap-5">
            <ActionsPanel c={c} statusLabel={statusLabelFor("staff")} me={user} canAct={officer} />
            <DeadlinesPanel caseId={id} policySource={policy.data?.source} canExplain={officer} />
            {/* Complaints are for officers and admins; maintenance staff have no part in them. */}
            {officer ? <StaffComplaintPanel caseId={id} canAct={officer} /> : null}
          </div>
          <div className="flex min-w-0 flex-col gap-5">
            <TriagePanel caseId={id} />
            <Panel title="Other cases at this home" id="case-related">
              <RelatedCases caseId={id} Status={StaffStatusBadge} />
            </Panel>
          </div>
        </div>
        <Panel title={c.channel === "sensor" ? "How this case began" : "The tenant's report"} id="case-report">
          <p className="mb-2 text-sm text-ink-soft">
            {c.channel === "sensor"
              ? "Opened by the landlord from a sensor alert: nobody in the home has reported it. The answers are the landlord's."
              : `The questions as the tenant saw them, with their answers. Came in by: ${labelFor(channelLabels, c.channel)}.`}
          </p>
          <ReportSummary
            audience="staff"
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
        </Panel>
        <HomeAdviceSection caseId={id} audience="staff" />
        <PhotosPanel id={id} />
      </>
    ),
    readings: (
      <>
        <ReadingsPanel c={c} />
        <EvaluationPanels id={id} />
      </>
    ),
    inspection: (
      <>
        <Panel title="Inspections" id="case-inspections">
          <div className="flex flex-col gap-5">
            {officer ? (
              <OnDemand openLabel="Record an inspection">
                <section aria-labelledby="case-inspection-form-heading" className="flex flex-col gap-3">
                  <h3 id="case-inspection-form-heading" className="text-lg font-bold">
                    Record an inspection
                  </h3>
                  <InspectionForm caseId={id} rooms={c.homeRooms} photoUpload={<InspectionPhotos caseId={id} />} />
                </section>
              </OnDemand>
            ) : null}
            <section aria-labelledby="case-inspection-list-heading" className="flex flex-col gap-3">
              <h3 id="case-inspection-list-heading" className="text-lg font-bold">
                Recorded inspections
              </h3>
              <InspectionList caseId={id} rooms={c.homeRooms} staffName={nameOf} />
            </section>
          </div>
        </Panel>
        <Panel title="HHSRS assessment" id="case-hhsrs">
          <div className="flex flex-col gap-5">
            <p className="text-sm text-ink-soft">
              Hazard 1, damp and mould growth. The server works out the score, band and Category.
            </p>
            {officer ? (
              <OnDemand openLabel="New assessment">
                <section aria-labelledby="case-hhsrs-form-heading" className="flex flex-col gap-3">
                  <h3 id="case-hhsrs-form-heading" className="text-lg font-bold">
                    New assessment
                  </h3>
                  <AssessmentForm caseId={id} />
                </section>
              </OnDemand>
            ) : null}
            <section aria-labelledby="case-hhsrs-versions-heading" className="flex flex-col gap-3">
              <h3 id="case-hhsrs-versions-heading" className="text-lg font-bold">
                Every version
              </h3>
              <AssessmentVersions caseId={id} staffName={nameOf} />
            </section>
          </div>
        </Panel>
      </>
    ),
    letters: (
      <>
        <Panel title="Written summary" id="case-summary">
          <OnDemand
            openLabel={officer ? "Write the written summary" : "Read the draft of the written summary"}
            description="The letter to the tenant after the inspection: what was found, what will be done and by when."
          >
            <SummarySection c={c} sender={sender} canSend={officer} />
          </OnDemand>
        </Panel>
        <Panel title="Messages and notes" id="case-messages">
          <CaseConversation caseId={id} viewer="staff" />
        </Panel>
      </>
    ),
    works: (
      <>
        <WorksPanel c={c} role={user.role} />
        <Panel title="Did the fix work?" id="case-verification">
          <VerificationSection caseId={id} caseStatus={c.status} canDecide={canManageWorks(user.role)} />
        </Panel>
      </>
    ),
    timeline: <TimelinePanel c={c} staffNames={staff.data} />,
  };

  return (
    <>
      <title>{`${workspaceTitle(c)} · Dewline`}</title>
      <CaseHeader
        c={c}
        status={<StatusBadge status={c.status} audience="staff" />}
        risk={worst ? STATE_LABELS[worst].label : undefined}
      />
      <DownloadEvidencePack caseId={c.id} reference={workspaceTitle(c)} />
      <WorkspaceTabs
        label="Parts of the case"
        tabs={TABS.map(([tabId, label]) => ({ id: tabId, label, content: content[tabId] }))}
        active={tab}
        onChange={chooseTab}
      />
    </>
  );
}

function PhotosPanel({ id }: { id: number }) {
  const photos = useCasePhotos(id);
  return (
    <Panel title="Photos" id="case-photos">
      <QueryState query={photos} loading="Loading photos…" failed="We couldn't load the photos">
        {(list) => <PhotoGallery photos={list} emptyText="No photos yet" />}
      </QueryState>
    </Panel>
  );
}

/** Inspection photos join the case's photos through the same upload the tenant uses. */
function InspectionPhotos({ caseId }: { caseId: number }) {
  const queryClient = useQueryClient();
  const upload = useUploadPhotos(caseId);
  return (
    <PhotoUploadForm
      upload={upload}
      buttonVariant="secondary"
      sendLabel={(n) => (n > 1 ? `Send ${n} photos` : "Send photo")}
      addedTitle={(n) => (n === 1 ? "1 photo added to the case" : `${n} photos added to the case`)}
      onAdded={() => {
        void queryClient.invalidateQueries({ queryKey: caseKeys.photos(caseId) });
        void queryClient.invalidateQueries({ queryKey: caseKeys.events(caseId) });
      }}
    />
  );
}

function WorksPanel({ c, role }: { c: CaseDto; role: Role }) {
  const deadlines = useDeadlines(c.id);
  const photos = useCasePhotos(c.id);
  const safetyWork = deadlines.data?.find((d) => d.stage === "safety-work")?.dueAt ?? null;
  return (
    <Panel title="Works" id="case-works">
      <div className="flex flex-col gap-5">
        {canOrderWorks(role) ? (
          <OnDemand openLabel="New work order">
            <section aria-labelledby="case-works-form-heading" className="flex flex-col gap-3">
              <h3 id="case-works-form-heading" className="text-lg font-bold">
                New work order
              </h3>
              <NewWorkOrderForm caseId={c.id} rooms={c.homeRooms} safetyWorkDueAt={safetyWork} />
            </section>
          </OnDemand>
        ) : null}
        <section aria-labelledby="case-works-list-heading" className="flex flex-col gap-3">
          <h3 id="case-works-list-heading" className="text-lg font-bold">
            Work orders
          </h3>
          <WorkOrderList
            caseId={c.id}
            canManage={canManageWorks(role)}
            photos={photos.data}
            Gallery={PhotoGallery}
            PhotoUpload={WorkOrderPhotos}
          />
        </section>
      </div>
    </Panel>
  );
}

/** After-photos of a work order, through the same picker as the case's photos. */
function WorkOrderPhotos({ caseId, workOrderId }: { caseId: number; workOrderId: number }) {
  const upload = useUploadWorkOrderPhotos(caseId, workOrderId);
  return (
    <PhotoUploadForm
      upload={upload}
      buttonVariant="secondary"
      hint="Photos of the finished work. JPEG, PNG, WebP or AVIF, up to 15 MB each."
      sendLabel={(n) => (n > 1 ? `Send ${n} after-photos` : "Send after-photo")}
      addedTitle={(n) => (n === 1 ? "1 after-photo added" : `${n} after-photos added`)}
    />
  );
}

function ReadingsPanel({ c }: { c: CaseDto }) {
  const readings = useCaseReadings(c.id);
  return (
    <Panel title="Readings" id="case-readings">
      <QueryState query={readings} loading="Loading readings…" failed="We couldn't load the readings">
        {(list) => <ReadingsSection readings={list} rooms={c.homeRooms} exportPath={`/cases/${c.id}/readings/export`} />}
      </QueryState>
    </Panel>
  );
}

function EvaluationPanels({ id }: { id: number }) {
  const evaluation = useCaseEvaluation(id);
  return (
    <>
      <Panel title="Diagnosis hints" id="case-diagnosis">
        <QueryState
          query={evaluation}
          loading="Working out what the readings point to…"
          failed="We couldn't work out the readings just now"
        >
          {(e) => <DiagnosisHints rooms={e.rooms} />}
        </QueryState>
      </Panel>
      <Panel title="What the readings show" id="case-evaluation">
        <QueryState
          query={evaluation}
          loading="Working out what the readings show…"
          failed="We couldn't work out the readings just now"
        >
          {(e) => <CaseEvaluationView evaluation={e} audience="staff" />}
        </QueryState>
      </Panel>
    </>
  );
}

function TimelinePanel({ c, staffNames }: { c: CaseDto; staffNames: readonly { id: number; name: string }[] | undefined }) {
  const events = useCaseEvents(c.id);
  // Admins and officers can send an e-mail about the case again (GET/POST /api/outbox).
  const canResend = ["admin", "officer"].includes(useUser().role);
  const names = useMemo(() => new Map((staffNames ?? []).map((s) => [s.id, s.name])), [staffNames]);
  return (
    <Panel title="Timeline" id="case-timeline">
      <p className="mb-3 text-sm text-ink-soft">
        Everything that has happened, newest first, with internal notes and where each e-mail went.
      </p>
      <QueryState query={events} loading="Loading the timeline…" failed="We couldn't load the timeline">
        {(list) => (
          <CaseTimeline
            events={list}
            rooms={c.homeRooms}
            audience="staff"
            staffNames={names}
            EmailAction={canResend ? ResendEmailButton : undefined}
          />
        )}
      </QueryState>
    </Panel>
  );
}
