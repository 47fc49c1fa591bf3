import { Alert } from "@/components/ui/alert";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { formatDateTime } from "@/lib/dates";
import { useStockImports } from "../api/get-stock-imports";

/** The landlord's earlier imports with their counts and reports. */
export function StockImportHistory() {
  const { data, isPending, isError, error } = useStockImports();
  if (isPending) return <LoadingState>Loading the imports…</LoadingState>;
  if (isError)
    return (
      <Alert tone="danger" title="The imports could not be loaded">
        {errorMessage(error)}
      </Alert>
    );
  if (data.imports.length === 0) return <EmptyState title="No imports yet">Imported registers are listed here.</EmptyState>;
  return (
    <table className="min-w-full text-sm">
      <thead>
        <tr>
          <th scope="col" className="text-left">
            When
          </th>
          <th scope="col" className="text-left">
            File
          </th>
          <th scope="col" className="text-right">
            New
          </th>
          <th scope="col" className="text-right">
            Updated
          </th>
          <th scope="col" className="text-right">
            Unchanged
          </th>
          <th scope="col" className="text-right">
            Refused
          </th>
          <th scope="col" className="text-left">
            Report
          </th>
        </tr>
      </thead>
      <tbody>
        {data.imports.map((i) => (
          <tr key={i.id}>
            <td>{formatDateTime(i.createdAt)}</td>
            <td>{i.fileName}</td>
            <td className="text-right">{i.created}</td>
            <td className="text-right">{i.updated}</td>
            <td className="text-right">{i.unchanged}</td>
            <td className="text-right">{i.refused}</td>
            <td>
              <a href={i.reportUrl} className="underline">
                CSV<span className="sr-only"> report of {i.fileName}</span>
              </a>
            </td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
