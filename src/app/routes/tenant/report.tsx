import { useQueryClient, type QueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useTranslation } from "react-i18next";
import { useNavigate } from "react-router-dom";
import { SafetyCautions } from "@/components/risk/cautions";
import { Alert } from "@/components/ui/alert";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingState } from "@/components/ui/spinner";
import { useUser } from "@/features/auth/api/get-me";
import { signedInAs } from "@/features/auth/api/require-role";
import { caseKeys } from "@/lib/query-keys";
import type { CaseDto } from "@/features/cases/api/types";
import { myHomeQueryOptions, useMyHome } from "@/features/my-home/api/get-my-home";
import { ReportForm } from "@/features/report/components/report-form";
import { WaitingReports } from "@/features/report/components/waiting-reports";
import { useKeptReports } from "@/features/report/hooks/use-report-queue";
import { Button } from "@/components/ui/button";
import { ApiError, errorMessage } from "@/lib/api-client";
import { i18n } from "@/lib/i18n/i18n";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["tenant"])) void queryClient.prefetchQuery(myHomeQueryOptions());
  return null;
};

export default function ReportPage() {
  const { t } = useTranslation("report", { i18n });
  const user = useUser();
  const home = useMyHome();
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const kept = useKeptReports(user.id);

  const openCase = (created: CaseDto | null, complete: boolean) => {
    void queryClient.invalidateQueries({ queryKey: caseKeys.lists() });
    if (!created) {
      navigate("/cases");
      return;
    }
    // POST /api/cases answers with the whole case: the case page can show it at once.
    queryClient.setQueryData(caseKeys.detail(created.id), created);
    // The case page thanks them, and says when photos or readings still need a retry.
    navigate(`/cases/${created.id}`, { state: { justSent: true, complete } });
  };

  return (
    <>
      <title>{t("page.documentTitle")}</title>
      <PageHeader title={t("page.title")} description={t("page.description")} />
      {home.isPending || !kept.loaded ? (
        <LoadingState>{t("page.loading")}</LoadingState>
      ) : home.isError ? (
        <Alert
          tone={home.error instanceof ApiError && home.error.status === 404 ? "info" : "danger"}
          title={home.error instanceof ApiError && home.error.status === 404 ? t("page.noHome") : t("page.homeFailed")}
        >
          {errorMessage(home.error)}
        </Alert>
      ) : (
        <div className="flex flex-col gap-8">
          <ReportOrWaiting
            userId={user.id}
            hasKept={kept.count > 0}
            form={(onQueued) => (
              <ReportForm
                userId={user.id}
                rooms={home.data.property.rooms}
                onSent={(created, complete) => openCase(created as unknown as CaseDto | null, complete)}
                onQueued={onQueued}
              />
            )}
            onKeptSent={(created) => openCase(created as unknown as CaseDto | null, true)}
          />
          <SafetyCautions />
        </div>
      )}
    </>
  );
}

interface ReportOrWaitingProps {
  userId: number;
  hasKept: boolean;
  form: (onQueued: () => void) => React.ReactNode;
  onKeptSent: (created: unknown) => void;
}

/**
 * Reports kept on the phone come first (a tenant who opens the page again sees theirs waiting, not an
 * empty form); the form is a click away. Decided once when the page opens, so the form stays while
 * its own report is being kept and tried.
 */
function ReportOrWaiting({ userId, hasKept, form, onKeptSent }: ReportOrWaitingProps) {
  const { t } = useTranslation("report", { i18n });
  const [writing, setWriting] = useState(!hasKept);
  return (
    <div className="flex flex-col gap-5">
      <WaitingReports userId={userId} showSent={false} onSent={(r) => onKeptSent(r.created)} />
      {writing ? (
        form(() => setWriting(false))
      ) : (
        <div>
          <Button variant="secondary" onClick={() => setWriting(true)}>
            {t("page.reportSomethingElse")}
          </Button>
        </div>
      )}
    </div>
  );
}
