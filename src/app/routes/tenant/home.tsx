import type { QueryClient } from "@tanstack/react-query";
import { Alert } from "@/components/ui/alert";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingState } from "@/components/ui/spinner";
import { signedInAs } from "@/features/auth/api/require-role";
import { myHomeQueryOptions, useMyHome } from "@/features/my-home/api/get-my-home";
import { HomeSummary } from "@/features/my-home/components/home-summary";
import { ReportComingSoon } from "@/features/my-home/components/report-coming-soon";
import { ApiError, errorMessage } from "@/lib/api-client";
import { streetAddress } from "@/lib/homes";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["tenant"])) void queryClient.prefetchQuery(myHomeQueryOptions());
  return null;
};

export default function MyHomePage() {
  const home = useMyHome();

  return (
    <>
      <title>My home · Dewline</title>
      <PageHeader
        title="My home"
        description={home.data ? `${streetAddress(home.data.property)}, ${home.data.property.town} ${home.data.property.postcode}` : undefined}
      />
      {home.isPending ? (
        <LoadingState>Loading your home…</LoadingState>
      ) : home.isError ? (
        <Alert
          tone={home.error instanceof ApiError && home.error.status === 404 ? "info" : "danger"}
          title={home.error instanceof ApiError && home.error.status === 404 ? "No home to show yet" : "We could not load your home"}
        >
          {errorMessage(home.error)}
        </Alert>
      ) : (
        <div className="flex flex-col gap-5">
          <ReportComingSoon />
          <HomeSummary home={home.data} />
        </div>
      )}
    </>
  );
}
