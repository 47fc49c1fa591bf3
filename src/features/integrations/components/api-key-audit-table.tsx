import { Alert } from "@/components/ui/alert";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { formatDateTime } from "@/lib/dates";
import { useApiKeyAudit } from "../api/get-api-key-audit";

/** The latest writes made with the landlord's keys, refusals included. */
export function ApiKeyAuditTable() {
  const audit = useApiKeyAudit();
  if (audit.isPending) return <LoadingState>Loading the changes made with keys…</LoadingState>;
  if (audit.isError)
    return (
      <Alert tone="danger" title="The list could not be loaded">
        {errorMessage(audit.error)}
      </Alert>
    );
  if (audit.data.entries.length === 0)
    return <EmptyState title="Nothing yet">Changes made through the API with your keys will be listed here.</EmptyState>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Changes made with API keys, newest first</caption>
        <thead>
          <tr className="border-b border-line">
            <th scope="col" className="py-2 pr-3">
              When
            </th>
            <th scope="col" className="py-2 pr-3">
              Key
            </th>
            <th scope="col" className="py-2 pr-3">
              Request
            </th>
            <th scope="col" className="py-2 pr-3">
              Answer
            </th>
          </tr>
        </thead>
        <tbody>
          {audit.data.entries.map((e) => (
            <tr key={e.id} className="border-b border-line">
              <td className="py-2 pr-3">{formatDateTime(e.at)}</td>
              <td className="py-2 pr-3">{e.key.name}</td>
              <td className="py-2 pr-3 font-mono">
                {e.method} {e.path}
              </td>
              <td className="py-2 pr-3">{e.status}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
