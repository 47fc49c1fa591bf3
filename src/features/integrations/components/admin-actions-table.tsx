import { Alert } from "@/components/ui/alert";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { adminActionLabels, type AdminActionSubject } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { useAdminActions } from "../api/get-admin-actions";

/** Who changed what in the landlord's API keys and webhook endpoints, and when; all, or about one kind of subject. */
export function AdminActionsTable({ subject }: { subject?: AdminActionSubject }) {
  const actions = useAdminActions(subject);
  if (actions.isPending) return <LoadingState>Loading the changes…</LoadingState>;
  if (actions.isError)
    return (
      <Alert tone="danger" title="The list could not be loaded">
        {errorMessage(actions.error)}
      </Alert>
    );
  if (actions.data.entries.length === 0)
    return (
      <EmptyState title="Nothing yet">Each change an admin makes here will be listed, with who made it and when.</EmptyState>
    );
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Changes made by admins, newest first</caption>
        <thead>
          <tr className="border-b border-line">
            <th scope="col" className="py-2 pr-3">
              When
            </th>
            <th scope="col" className="py-2 pr-3">
              Who
            </th>
            <th scope="col" className="py-2 pr-3">
              What
            </th>
            <th scope="col" className="py-2 pr-3">
              Details
            </th>
          </tr>
        </thead>
        <tbody>
          {actions.data.entries.map((a) => (
            <tr key={a.id} className="border-b border-line">
              <td className="py-2 pr-3">{formatDateTime(a.at)}</td>
              <td className="py-2 pr-3">{a.by?.name ?? "A former admin"}</td>
              <td className="py-2 pr-3">{adminActionLabels[a.action]}</td>
              <td className="py-2 pr-3 break-all">{a.detail}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
