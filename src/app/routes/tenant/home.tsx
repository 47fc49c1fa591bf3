import type { QueryClient } from "@tanstack/react-query";
import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingState } from "@/components/ui/spinner";
import { signedInAs } from "@/features/auth/api/require-role";
import { myHomeQueryOptions, useMyHome } from "@/features/my-home/api/get-my-home";
import { myOutlookQueryOptions } from "@/features/my-home/api/get-my-outlook";
import { CondensationOutlookCard } from "@/features/my-home/components/condensation-outlook-card";
import { HomeSummary } from "@/features/my-home/components/home-summary";
import { TextChoiceCard } from "@/features/my-home/components/text-choice-card";
import { myCasesQueryOptions } from "@/features/cases/api/get-my-cases";
import { MyCases } from "@/features/cases/components/case-list";
import { StartReport } from "@/features/report/components/start-report";
import { WaitingReports } from "@/features/report/components/waiting-reports";
import { useUser } from "@/features/auth/api/get-me";
import { ApiError, errorMessage } from "@/lib/api-client";
import { streetAddress } from "@/lib/homes";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["tenant"])) {
    void queryClient.prefetchQuery(myHomeQueryOptions());
    void queryClient.prefetchQuery(myCasesQueryOptions());
    void queryClient.prefetchQuery(myOutlookQueryOptions());
  }
  return null;
};

export default function MyHomePage() {
  const home = useMyHome();
  const user = useUser();
  const { t } = useTranslation("home");

  return (
    <>
      <title>{t("myHome.title") + t("titleSuffix")}</title>
      <PageHeader
        title={t("myHome.title")}
        description={
          home.data ? (
            <span translate="no">{`${streetAddress(home.data.property)}, ${home.data.property.town} ${home.data.property.postcode}`}</span>
          ) : undefined
        }
      />
      {/* A report kept on this phone shows even when the home's details cannot load (no signal). */}
      <WaitingReports userId={user.id} />
      {home.isPending ? (
        <LoadingState>{t("myHome.loading")}</LoadingState>
      ) : home.isError ? (
        <Alert
          tone={home.error instanceof ApiError && home.error.status === 404 ? "info" : "danger"}
          title={home.error instanceof ApiError && home.error.status === 404 ? t("myHome.noHome") : t("myHome.loadError")}
        >
          {errorMessage(home.error)}
        </Alert>
      ) : (
        <div className="flex flex-col gap-5">
          <StartReport />
          <Panel title={t("myHome.yourReports")} id="home-reports">
            <MyCases limit={3} headingLevel={3} emptyAction={false} />
          </Panel>
          <CondensationOutlookCard />
          <HomeSummary home={home.data} />
          <TextChoiceCard />
        </div>
      )}
    </>
  );
}
