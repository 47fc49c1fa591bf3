import type { QueryClient } from "@tanstack/react-query";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { policyQueryOptions } from "@/features/policy/api/get-policy";
import { PolicyForm } from "@/features/policy/components/policy-form";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["admin"])) void queryClient.prefetchQuery(policyQueryOptions());
  return null;
};

export default function DeadlinePolicyPage() {
  return (
    <>
      <title>Deadline policy · Dewline</title>
      <PageHeader
        title="Deadline policy"
        description="How long your organisation allows for each step of a damp and mould case. Every case's deadlines are worked out from these timeframes."
      />
      <Panel title="Timeframes" id="timeframes" className="max-w-reading">
        <PolicyForm />
      </Panel>
    </>
  );
}
