import type { QueryClient } from "@tanstack/react-query";
import { Link } from "react-router-dom";
import { buttonClasses } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { myCasesQueryOptions } from "@/features/cases/api/get-my-cases";
import { MyCases } from "@/features/cases/components/case-list";
import { UnreadMessages } from "@/features/conversation/components/unread-messages";
import { WaitingReports } from "@/features/report/components/waiting-reports";
import { useUser } from "@/features/auth/api/get-me";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["tenant"])) void queryClient.prefetchQuery(myCasesQueryOptions());
  return null;
};

export default function MyReportsPage() {
  const user = useUser();
  return (
    <>
      <title>My reports · Dewline</title>
      <PageHeader
        title="My reports"
        description="Every report you have sent, newest first. Open one to see what has happened, add photos or readings, or tell your landlord it has got worse."
        actions={
          <Link to="/report" className={buttonClasses("primary")}>
            Report damp or mould
          </Link>
        }
      />
      <WaitingReports userId={user.id} />
      <UnreadMessages viewer="tenant" />
      <MyCases />
    </>
  );
}
