import type { QueryClient } from "@tanstack/react-query";
import { Link } from "react-router-dom";
import { buttonClasses } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { myCasesQueryOptions } from "@/features/cases/api/get-my-cases";
import { MyCases } from "@/features/cases/components/case-list";
import { UnreadMessages } from "@/features/conversation/components/unread-messages";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["tenant"])) void queryClient.prefetchQuery(myCasesQueryOptions());
  return null;
};

export default function MyReportsPage() {
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
      <UnreadMessages viewer="tenant" />
      <MyCases />
    </>
  );
}
