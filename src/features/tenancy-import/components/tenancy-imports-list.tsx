import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import type { InvitationProgress, TenancyImportSummary } from "@/lib/contracts";
import { formatDateTimeZoned } from "@/lib/dates";
import { useTenancyImports } from "../api/get-tenancy-imports";
import { useInvitationBatchAction } from "../api/invitation-batch-actions";

const count = (n: number) => n.toLocaleString("en-GB");

function progressText(p: InvitationProgress): string {
  const done = `${count(p.sent)} of ${count(p.total)} invited`;
  const notSent = [p.skipped ? `${count(p.skipped)} skipped` : "", p.cancelled ? `${count(p.cancelled)} withdrawn` : ""]
    .filter(Boolean)
    .join(", ");
  const state =
    p.state === "sending"
      ? p.nextReleaseAt
        ? `next batch at ${formatDateTimeZoned(p.nextReleaseAt)}`
        : "next batch soon"
      : p.state === "paused"
        ? "paused"
        : p.state === "cancelled"
          ? "cancelled"
          : "all sent";
  return [done, notSent, state].filter(Boolean).join(", ");
}

function ImportRow({ item, onCancel }: { item: TenancyImportSummary; onCancel: (item: TenancyImportSummary) => void }) {
  const action = useInvitationBatchAction();
  const p = item.invitations;
  return (
    <li className="border-b border-line py-3">
      <p className="font-semibold text-ink">
        {item.fileName} · {formatDateTimeZoned(item.createdAt)} · {item.createdBy}
      </p>
      <p className="text-sm">
        {count(item.rows)} rows: {count(item.created)} added, {count(item.updated)} updated, {count(item.unchanged)} unchanged,{" "}
        {count(item.rejected)} not imported.{" "}
        <a className="font-semibold underline" href={`/api/tenancy-imports/${item.id}/report.csv`} download>
          Report (CSV)
        </a>
      </p>
      {p ? (
        <div className="mt-2 flex flex-wrap items-center gap-2">
          <progress max={p.total} value={p.sent + p.skipped + p.cancelled} aria-label={`Invitations for ${item.fileName}`} />
          <span className="text-sm" role="status">
            {progressText(p)}
          </span>
          {p.state === "sending" ? (
            <Button
              size="sm"
              variant="secondary"
              busy={action.isPending}
              onClick={() => action.mutate({ importId: item.id, action: "pause" })}
            >
              Pause
            </Button>
          ) : null}
          {p.state === "paused" ? (
            <Button
              size="sm"
              variant="secondary"
              busy={action.isPending}
              onClick={() => action.mutate({ importId: item.id, action: "resume" })}
            >
              Resume
            </Button>
          ) : null}
          {p.state === "sending" || p.state === "paused" ? (
            <Button size="sm" variant="ghost" onClick={() => onCancel(item)}>
              Stop the rest
            </Button>
          ) : null}
        </div>
      ) : (
        <p className="text-sm text-ink-muted">No invitations were needed.</p>
      )}
      {action.isError ? <Alert tone="danger">{errorMessage(action.error)}</Alert> : null}
    </li>
  );
}

/** The latest imports with their invitations' progress; pause, resume or stop the invitations not sent yet. */
export function TenancyImportsList() {
  const imports = useTenancyImports();
  const cancel = useInvitationBatchAction();
  const [cancelling, setCancelling] = useState<TenancyImportSummary | null>(null);

  if (imports.isPending) return <LoadingState>Loading the imports…</LoadingState>;
  if (imports.isError) return <Alert tone="danger">{errorMessage(imports.error)}</Alert>;
  if (imports.data.items.length === 0) {
    return <EmptyState title="No tenancy files imported yet">Imports and their invitations appear here.</EmptyState>;
  }
  return (
    <>
      <ul>
        {imports.data.items.map((item) => (
          <ImportRow key={item.id} item={item} onCancel={setCancelling} />
        ))}
      </ul>
      <ConfirmDialog
        open={cancelling !== null}
        title="Stop the invitations not sent yet?"
        confirmLabel="Stop them"
        tone="danger"
        busy={cancel.isPending}
        error={cancel.isError ? errorMessage(cancel.error) : null}
        onConfirm={() =>
          cancelling && cancel.mutate({ importId: cancelling.id, action: "cancel" }, { onSuccess: () => setCancelling(null) })
        }
        onCancel={() => setCancelling(null)}
      >
        Invitations already sent stay valid. The accounts stay, waiting: you can invite each person later from Users and
        invitations, or import the file again.
      </ConfirmDialog>
    </>
  );
}
