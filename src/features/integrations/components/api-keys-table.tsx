import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import type { ApiKeyResponse } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { useApiKeys } from "../api/get-api-keys";
import { useRevokeApiKey } from "../api/revoke-api-key";

/** The landlord's keys: name, scopes, who made it, when it was last used; revoke with a confirmation. */
export function ApiKeysTable() {
  const keys = useApiKeys();
  const revoke = useRevokeApiKey();
  const [revoking, setRevoking] = useState<ApiKeyResponse | null>(null);

  if (keys.isPending) return <LoadingState>Loading the API keys…</LoadingState>;
  if (keys.isError)
    return (
      <Alert tone="danger" title="The API keys could not be loaded">
        {errorMessage(keys.error)}
      </Alert>
    );
  if (keys.data.keys.length === 0)
    return <EmptyState title="No API keys yet">Create one for each system that should reach your data.</EmptyState>;

  return (
    <>
      <div className="overflow-x-auto">
        <table className="w-full text-left text-sm">
          <caption className="sr-only">API keys</caption>
          <thead>
            <tr className="border-b border-line">
              <th scope="col" className="py-2 pr-3">
                Name
              </th>
              <th scope="col" className="py-2 pr-3">
                Key starts
              </th>
              <th scope="col" className="py-2 pr-3">
                May
              </th>
              <th scope="col" className="py-2 pr-3">
                Created
              </th>
              <th scope="col" className="py-2 pr-3">
                Last used
              </th>
              <th scope="col" className="py-2 pr-3">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {keys.data.keys.map((k) => (
              <tr key={k.id} className="border-b border-line align-top">
                <th scope="row" className="py-2 pr-3 font-semibold">
                  {k.name}
                </th>
                <td className="py-2 pr-3 font-mono">{k.hint}</td>
                <td className="py-2 pr-3">{k.scopes.join(", ")}</td>
                <td className="py-2 pr-3">
                  {formatDateTime(k.createdAt)}
                  {k.createdBy ? ` by ${k.createdBy.name}` : ""}
                </td>
                <td className="py-2 pr-3">{k.lastUsedAt ? formatDateTime(k.lastUsedAt) : "Never"}</td>
                <td className="py-2 pr-3">
                  {k.revokedAt ? (
                    <span>Revoked {formatDateTime(k.revokedAt)}</span>
                  ) : (
                    <Button size="sm" variant="danger" onClick={() => setRevoking(k)} aria-label={`Revoke the key ${k.name}`}>
                      Revoke
                    </Button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <ConfirmDialog
        open={revoking !== null}
        title={revoking ? `Revoke "${revoking.name}"?` : ""}
        confirmLabel="Revoke the key"
        tone="danger"
        busy={revoke.isPending}
        error={revoke.isError ? errorMessage(revoke.error) : null}
        onCancel={() => {
          setRevoking(null);
          revoke.reset();
        }}
        onConfirm={() => {
          if (revoking) revoke.mutate(revoking.id, { onSuccess: () => setRevoking(null) });
        }}
      >
        The system using this key will be refused from the moment you confirm. This cannot be undone: to connect it again, create
        a new key.
      </ConfirmDialog>
    </>
  );
}
