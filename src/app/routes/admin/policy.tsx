import type { QueryClient } from "@tanstack/react-query";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { policyQueryOptions } from "@/features/policy/api/get-policy";
import { PolicyForm } from "@/features/policy/components/policy-form";
import { ComplaintPolicyForm } from "@/features/policy/components/complaint-policy-form";
import { complaintPolicyQueryOptions } from "@/features/policy/api/get-complaint-policy";
import { sensorAlertPolicyQueryOptions } from "@/features/policy/api/sensor-alert-policy";
import { SensorAlertPolicyForm } from "@/features/policy/components/sensor-alert-policy-form";
import { HeatingSupportForm } from "@/features/policy/components/heating-support-form";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["admin"])) {
    void queryClient.prefetchQuery(policyQueryOptions());
    void queryClient.prefetchQuery(complaintPolicyQueryOptions());
    void queryClient.prefetchQuery(sensorAlertPolicyQueryOptions());
  }
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
      <Panel title="Complaints" id="complaints" className="mt-5 max-w-reading">
        <ComplaintPolicyForm />
      </Panel>
      <Panel title="Sensor alerts" id="sensor-alerts" className="mt-5 max-w-reading">
        <SensorAlertPolicyForm />
      </Panel>
      <Panel title="Help with heating costs" id="heating-support" className="mt-5 max-w-reading">
        <HeatingSupportForm />
      </Panel>
    </>
  );
}
