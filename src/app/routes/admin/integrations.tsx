import type { QueryClient } from "@tanstack/react-query";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { adminActionsQueryOptions } from "@/features/integrations/api/get-admin-actions";
import { apiKeyAuditQueryOptions } from "@/features/integrations/api/get-api-key-audit";
import { apiKeysQueryOptions } from "@/features/integrations/api/get-api-keys";
import { AdminActionsTable } from "@/features/integrations/components/admin-actions-table";
import { ApiKeyAuditTable } from "@/features/integrations/components/api-key-audit-table";
import { ApiKeysTable } from "@/features/integrations/components/api-keys-table";
import { CreateApiKeyForm } from "@/features/integrations/components/create-api-key-form";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["admin"])) {
    void queryClient.prefetchQuery(apiKeysQueryOptions());
    void queryClient.prefetchQuery(apiKeyAuditQueryOptions());
    void queryClient.prefetchQuery(adminActionsQueryOptions());
  }
  return null;
};

export default function IntegrationsPage() {
  return (
    <>
      <title>Integrations · Dewline</title>
      <PageHeader
        title="Integrations"
        description="Connect your other systems to Dewline. Each API key reaches only your organisation's data, and only what its scopes allow. The API reference is at /api/docs."
      />
      <Panel title="API keys" id="api-keys">
        <ApiKeysTable />
      </Panel>
      <Panel title="Create an API key" id="new-api-key">
        <CreateApiKeyForm />
      </Panel>
      <Panel title="Changes made with API keys" id="api-key-audit">
        <ApiKeyAuditTable />
      </Panel>
      <Panel title="Changes made by admins (keys and webhooks)" id="admin-actions">
        <AdminActionsTable />
      </Panel>
    </>
  );
}
