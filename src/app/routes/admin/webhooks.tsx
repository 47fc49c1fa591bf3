import type { QueryClient } from "@tanstack/react-query";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { adminActionsQueryOptions } from "@/features/integrations/api/get-admin-actions";
import { AdminActionsTable } from "@/features/integrations/components/admin-actions-table";
import { webhooksQueryOptions } from "@/features/webhooks/api/get-webhooks";
import { WebhookForm } from "@/features/webhooks/components/webhook-form";
import { WebhookList } from "@/features/webhooks/components/webhook-list";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["admin"])) {
    void queryClient.prefetchQuery(webhooksQueryOptions());
    void queryClient.prefetchQuery(adminActionsQueryOptions("webhook"));
  }
  return null;
};

export default function WebhooksPage() {
  return (
    <>
      <title>Webhooks · Dewline</title>
      <PageHeader
        title="Webhooks"
        description="Tell your own systems about case events as they happen. Each event is signed with the endpoint's secret; one that cannot be delivered is tried again by itself."
      />
      <Panel title="Endpoints" id="endpoints">
        <WebhookList />
      </Panel>
      <Panel title="Add an endpoint" id="add-endpoint">
        <WebhookForm />
      </Panel>
      <Panel title="Changes made by admins" id="admin-actions">
        <AdminActionsTable subject="webhook" />
      </Panel>
    </>
  );
}
