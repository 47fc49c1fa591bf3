import { useQueryClient, type QueryClient } from "@tanstack/react-query";
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
import { ApiError, errorMessage } from "@/lib/api-client";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["tenant"])) void queryClient.prefetchQuery(myHomeQueryOptions());
  return null;
};

export default function ReportPage() {
  const user = useUser();
  const home = useMyHome();
  const navigate = useNavigate();
  const queryClient = useQueryClient();

  return (
    <>
      <title>Report damp or mould · Dewline</title>
      <PageHeader
        title="Report damp or mould"
        description="Tell your landlord what you can see, a few questions at a time. Your landlord will look into every report."
      />
      {home.isPending ? (
        <LoadingState>Getting your home's details…</LoadingState>
      ) : home.isError ? (
        <Alert
          tone={home.error instanceof ApiError && home.error.status === 404 ? "info" : "danger"}
          title={
            home.error instanceof ApiError && home.error.status === 404
              ? "We can't find a home to report for"
              : "We couldn't load your home's details"
          }
        >
          {errorMessage(home.error)}
        </Alert>
      ) : (
        <div className="flex flex-col gap-8">
          <ReportForm
            userId={user.id}
            rooms={home.data.property.rooms}
            onSent={(created, complete) => {
              // POST /api/cases answers with the whole case: the case page can show it at once.
              queryClient.setQueryData(caseKeys.detail(created.id), created as unknown as CaseDto);
              void queryClient.invalidateQueries({ queryKey: caseKeys.lists() });
              // The case page thanks them, and says when photos or readings still need a retry.
              navigate(`/cases/${created.id}`, { state: { justSent: true, complete } });
            }}
          />
          <SafetyCautions />
        </div>
      )}
    </>
  );
}
