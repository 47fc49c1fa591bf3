import { useEffect, useRef, useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Select, Textarea } from "@/components/ui/field";
import { roleLabels, type Role } from "@/lib/roles";
import { canTransition, movesValidForAll } from "@/lib/domain/case-workflow";
import { CASE_STATUSES, type CaseStatus } from "@/lib/domain/case-workflow";
import type { BulkUpdateResult, QueueItem, StaffMember } from "../api/types";
import { casesCount } from "../lib/labels";

const referenceOf = (item: { id: number; reference: string | null }) => item.reference ?? `Case ${item.id}`;
const isStatus = (value: string): value is CaseStatus => (CASE_STATUSES as readonly string[]).includes(value);

/** The bar over the table while cases are ticked. */
export function BulkBar({
  count,
  onAssign,
  onStatus,
  onClear,
}: {
  count: number;
  onAssign: () => void;
  onStatus: () => void;
  onClear: () => void;
}) {
  return (
    <div aria-live="polite">
      {count > 0 ? (
        <div
          role="group"
          aria-label="Change the selected cases"
          className="flex flex-wrap items-center gap-2 rounded-md border border-dew-600 bg-dew-50 px-3 py-2"
        >
          <p className="mr-2 font-bold">{count} selected</p>
          <Button size="sm" onClick={onAssign}>
            Assign to…
          </Button>
          <Button size="sm" variant="secondary" onClick={onStatus}>
            Change status…
          </Button>
          <Button size="sm" variant="ghost" onClick={onClear}>
            Clear selection
          </Button>
        </div>
      ) : null}
    </div>
  );
}

/** Up to eight references, then "and N more". */
function ReferenceList({ items }: { items: readonly QueueItem[] }) {
  const shown = items.slice(0, 8);
  return (
    <p className="text-sm text-ink-soft">
      {shown.map(referenceOf).join(", ")}
      {items.length > shown.length ? `, and ${items.length - shown.length} more` : ""}
    </p>
  );
}

interface AssignDialogProps {
  open: boolean;
  items: readonly QueueItem[];
  staff: readonly StaffMember[] | undefined;
  busy: boolean;
  serverError: string | null;
  onConfirm: (assigneeId: number | null, name: string) => void;
  onCancel: () => void;
}

export function BulkAssignDialog({ open, items, staff, busy, serverError, onConfirm, onCancel }: AssignDialogProps) {
  const [choice, setChoice] = useState("");
  const [missing, setMissing] = useState(false);
  const [wasOpen, setWasOpen] = useState(open);
  if (open !== wasOpen) {
    // A fresh choice each time the dialog opens.
    setWasOpen(open);
    if (open) {
      setChoice("");
      setMissing(false);
    }
  }
  const person = staff?.find((p) => String(p.id) === choice);
  const target = choice === "none" ? "no one (unassigned)" : person?.name;
  const n = items.length;

  return (
    <ConfirmDialog
      open={open}
      title={`Assign ${casesCount(n)}?`}
      confirmLabel={`Assign ${casesCount(n)}`}
      busy={busy}
      error={serverError}
      onCancel={onCancel}
      onConfirm={() => {
        if (choice === "none") onConfirm(null, "no one");
        else if (person) onConfirm(person.id, person.name);
        else setMissing(true);
      }}
    >
      <div className="flex flex-col gap-3">
        <Select
          label="Assign to"
          value={choice}
          error={missing && !target ? "Choose who the cases go to." : undefined}
          onChange={(e) => {
            setChoice(e.target.value);
            setMissing(false);
          }}
        >
          <option value="">Choose a person…</option>
          <option value="none">No one (take the cases off whoever has them)</option>
          {(staff ?? []).map((p) => (
            <option key={p.id} value={String(p.id)}>
              {p.name} ({roleLabels[p.role as Role] ?? p.role})
            </option>
          ))}
        </Select>
        <p>
          {target ? (
            <>
              <strong>{casesCount(n)}</strong> will be assigned to <strong>{target}</strong>.
            </>
          ) : (
            <>
              Choose who the <strong>{casesCount(n)}</strong> should be assigned to.
            </>
          )}
        </p>
        <ReferenceList items={items} />
      </div>
    </ConfirmDialog>
  );
}

interface StatusDialogProps {
  open: boolean;
  items: readonly QueueItem[];
  statusLabel: (status: string) => string;
  busy: boolean;
  serverError: string | null;
  onConfirm: (status: CaseStatus, reason: string | undefined) => void;
  onCancel: () => void;
}

export function BulkStatusDialog({ open, items, statusLabel, busy, serverError, onConfirm, onCancel }: StatusDialogProps) {
  const [target, setTarget] = useState("");
  const [reason, setReason] = useState("");
  const [tried, setTried] = useState(false);
  const [wasOpen, setWasOpen] = useState(open);
  if (open !== wasOpen) {
    setWasOpen(open);
    if (open) {
      setTarget("");
      setReason("");
      setTried(false);
    }
  }

  const to = isStatus(target) ? target : null;
  const n = items.length;
  const from = (item: QueueItem) => (isStatus(item.status) ? item.status : null);
  const froms = items.map(from).filter((s): s is CaseStatus => s !== null);
  // Moves every selected case can make come first; a move only some can make is offered apart,
  // and the cases it would skip are named before anything is confirmed.
  const common = froms.length === n ? movesValidForAll(froms) : [];
  const partial = CASE_STATUSES.filter((s) => !common.includes(s) && froms.some((f) => canTransition(f, s)));
  const movable = to ? items.filter((i) => from(i) !== null && canTransition(from(i)!, to)) : [];
  const skipped = to ? items.filter((i) => !movable.includes(i)) : [];
  // A status changed by hand always says why (the case follows its work by itself otherwise).
  const reasonError = reason.trim().length < 3 ? "Give a short reason (at least 3 characters)." : undefined;
  const statusError = to === null ? "Choose the new status." : undefined;
  const canMove = (s: CaseStatus) => items.filter((i) => from(i) !== null && canTransition(from(i)!, s)).length;

  return (
    <ConfirmDialog
      open={open}
      title={`Change the status of ${casesCount(n)}?`}
      confirmLabel={to ? `Move ${casesCount(movable.length)} to ${statusLabel(to)}` : "Change status"}
      tone={to === "cancelled" ? "danger" : "primary"}
      busy={busy}
      error={serverError}
      onCancel={onCancel}
      onConfirm={() => {
        setTried(true);
        if (!to || reasonError || movable.length === 0) return;
        onConfirm(to, reason.trim());
      }}
    >
      <div className="flex flex-col gap-3">
        {common.length === 0 && partial.length === 0 ? (
          <Alert tone="warning" live="none">
            None of these cases can move to another status from where it is now.
          </Alert>
        ) : (
          <Select
            label="New status"
            hint="The status moves by itself as the work is recorded. Change it here only for an exception."
            value={target}
            error={tried ? statusError : undefined}
            onChange={(e) => setTarget(e.target.value)}
          >
            <option value="">Choose a status…</option>
            {common.length ? (
              <optgroup label="Every selected case can move to">
                {common.map((s) => (
                  <option key={s} value={s}>
                    {statusLabel(s)}
                  </option>
                ))}
              </optgroup>
            ) : null}
            {partial.length ? (
              <optgroup label="Only some can (the others are skipped)">
                {partial.map((s) => (
                  <option key={s} value={s}>
                    {statusLabel(s)} ({canMove(s)} of {n})
                  </option>
                ))}
              </optgroup>
            ) : null}
          </Select>
        )}
        {to ? (
          <>
            <p>
              <strong>{casesCount(movable.length)}</strong> will move to <strong>{statusLabel(to)}</strong>.
            </p>
            {skipped.length > 0 ? (
              <Alert tone="warning" live="none" title={`${casesCount(skipped.length)} will be skipped`}>
                <p>
                  {skipped.length === 1 ? "This case" : "These cases"} cannot move to {statusLabel(to)} from the status{" "}
                  {skipped.length === 1 ? "it is" : "they are"} in now and will be left as{" "}
                  {skipped.length === 1 ? "it is" : "they are"}:
                </p>
                <ul className="mt-1 list-disc pl-5">
                  {skipped.slice(0, 20).map((i) => (
                    <li key={i.id}>
                      {referenceOf(i)} ({statusLabel(i.status)})
                    </li>
                  ))}
                </ul>
                {skipped.length > 20 ? <p>and {skipped.length - 20} more.</p> : null}
              </Alert>
            ) : null}
          </>
        ) : null}
        {to ? (
          <Textarea
            label="Reason"
            hint="Needed for every change made by hand. It is kept in each case's history."
            value={reason}
            maxLength={2000}
            error={tried ? reasonError : undefined}
            onChange={(e) => setReason(e.target.value)}
          />
        ) : null}
        <ReferenceList items={items} />
      </div>
    </ConfirmDialog>
  );
}

export interface BulkOutcome {
  /** What was asked for, e.g. "assigned to Priya Venn". */
  change: string;
  result: BulkUpdateResult;
}

/** What a bulk change did: how many cases changed, and each one that did not, with the server's reason. */
export function BulkResult({ outcome, onDismiss }: { outcome: BulkOutcome; onDismiss: () => void }) {
  const { updated, failed } = outcome.result;
  const ref = useRef<HTMLDivElement>(null);
  // The buttons that opened the dialog go with the selection, so focus moves to the result instead.
  useEffect(() => ref.current?.focus(), [outcome]);
  return (
    <div ref={ref} tabIndex={-1} className="rounded-md focus:outline-2 focus:outline-offset-2 focus:outline-dew-700">
      <Alert
        tone={failed.length === 0 ? "success" : updated.length === 0 ? "danger" : "warning"}
        live={failed.length === 0 ? "status" : "alert"}
        title={`${casesCount(updated.length)} updated`}
      >
        {updated.length > 0 ? (
          <p>
            {updated.length === 1 ? "It was" : "They were"} {outcome.change}.
          </p>
        ) : null}
        {failed.length > 0 ? (
          <>
            <p className="mt-1 font-semibold">{casesCount(failed.length)} could not be changed:</p>
            <ul className="mt-1 list-disc pl-5">
              {failed.map((f) => (
                <li key={f.id}>
                  <span className="font-semibold">{referenceOf(f)}</span>: {f.message}
                </li>
              ))}
            </ul>
          </>
        ) : null}
        <Button size="sm" variant="ghost" className="mt-2 -ml-3" onClick={onDismiss}>
          Dismiss
        </Button>
      </Alert>
    </div>
  );
}
