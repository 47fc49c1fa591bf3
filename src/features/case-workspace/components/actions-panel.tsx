import { useId, useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Select, Textarea } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { CASE_STATUSES, CASE_TRANSITIONS, transitionNeedsReason, type CaseStatus } from "@/lib/domain/case-workflow";
import { isRole, roleLabels } from "@/lib/roles";
import { useStaff } from "@/lib/staff";
import type { HazardClass, WorkspaceCase } from "../api/types";
import { useUpdateCase } from "../api/update-case";
import { HAZARD_CLASS_CHOICES, hazardClassLabel } from "../lib/labels";
import { RadioGroup } from "@/components/ui/option-radio-group";
import { OnDemand } from "./on-demand";

const isCaseStatus = (s: string): s is CaseStatus => (CASE_STATUSES as readonly string[]).includes(s);

interface ActionsPanelProps {
  c: WorkspaceCase;
  /** The status in words, as the rest of the app says it. */
  statusLabel: (status: string) => string;
  /** The signed-in member of staff. */
  me: { id: number };
  /** Officers and administrators change a case; maintenance leads read it. */
  canAct: boolean;
}

export function ActionsPanel({ c, statusLabel, me, canAct }: ActionsPanelProps) {
  if (!canAct) {
    return (
      <Panel title="Status, assignee and hazard class" id="case-actions">
        <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
          <dt className="font-semibold">Status</dt>
          <dd>{statusLabel(c.status)}</dd>
          <dt className="font-semibold">Hazard class</dt>
          <dd>
            {hazardClassLabel(c.hazardClass)}
            {c.hazardClassReason ? <span className="block text-ink-soft">Reason: {c.hazardClassReason}</span> : null}
          </dd>
        </dl>
        <p className="mt-3 text-ink-soft">
          Only housing officers and administrators can change the status, the assignee or the hazard class.
        </p>
      </Panel>
    );
  }
  return (
    <Panel title="Actions" id="case-actions">
      <div className="flex flex-col gap-3">
        <OnDemand openLabel="Change the status">
          <StatusForm c={c} statusLabel={statusLabel} />
        </OnDemand>
        <OnDemand openLabel="Assign the case">
          <AssignForm c={c} me={me} />
        </OnDemand>
        <OnDemand openLabel="Classify the hazard">
          <HazardForm c={c} />
        </OnDemand>
      </div>
    </Panel>
  );
}

function StatusForm({ c, statusLabel }: { c: WorkspaceCase; statusLabel: (s: string) => string }) {
  const headingId = useId();
  const update = useUpdateCase(c.id, "status");
  const [to, setTo] = useState("");
  const [reason, setReason] = useState("");
  const [errors, setErrors] = useState<{ to?: string; reason?: string }>({});
  const [confirming, setConfirming] = useState(false);
  const [done, setDone] = useState<string | null>(null);
  const toRef = useRef<HTMLSelectElement>(null);
  const reasonRef = useRef<HTMLTextAreaElement>(null);

  const from = c.status;
  const allowed = isCaseStatus(from) ? CASE_TRANSITIONS[from] : [];
  // Cancelling and reopening always say why; so does every other move made by hand (the case
  // follows its work by itself, so a hand move is an exception).
  const reopensOrCancels = isCaseStatus(from) && isCaseStatus(to) && transitionNeedsReason(from, to);

  const send = () => {
    const trimmed = reason.trim();
    update.mutate(
      { status: to, ...(trimmed ? { reason: trimmed } : {}) },
      {
        onSuccess: () => {
          setDone(`The status is now “${statusLabel(to)}”.`);
          setTo("");
          setReason("");
          setConfirming(false);
        },
        onError: () => setConfirming(false),
      },
    );
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setDone(null);
    const found: typeof errors = {};
    if (!to) found.to = "Choose the status to move the case to.";
    if (reason.trim().length < 3)
      found.reason = !reopensOrCancels
        ? "Say why you are changing the status by hand."
        : to === "cancelled"
          ? "Say why the case is being cancelled."
          : "Say why the case is being reopened.";
    setErrors(found);
    if (found.to) return toRef.current?.focus();
    if (found.reason) return reasonRef.current?.focus();
    if (to === "cancelled") setConfirming(true);
    else send();
  };

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3">
      <h3 id={headingId} className="text-lg font-bold">
        Change status
      </h3>
      <p>
        Now: <strong>{statusLabel(from)}</strong>
      </p>
      {allowed.length === 0 ? (
        <p className="text-ink-soft">The workflow has no next step from this status.</p>
      ) : (
        <form onSubmit={submit} noValidate className="flex flex-col gap-3">
          <Select
            ref={toRef}
            label="Move to"
            hint="The status moves by itself when an inspection, the written summary, booked or finished works, or the verdict on the fix is recorded. Change it here only for an exception."
            value={to}
            error={errors.to}
            onChange={(e) => {
              setTo(e.target.value);
              setErrors({});
              update.reset();
            }}
            controlClassName="sm:max-w-xs"
          >
            <option value="">Choose a status</option>
            {allowed.map((s) => (
              <option key={s} value={s}>
                {statusLabel(s)}
              </option>
            ))}
          </Select>
          <Textarea
            ref={reasonRef}
            label="Reason"
            hint={
              reopensOrCancels && to === "cancelled"
                ? "Needed when cancelling a case. Staff see it in the timeline."
                : reopensOrCancels
                  ? "Needed when reopening a case. Staff see it in the timeline."
                  : "Needed for every change made by hand. Staff see it in the timeline."
            }
            rows={2}
            maxLength={2000}
            value={reason}
            error={errors.reason}
            onChange={(e) => {
              setReason(e.target.value);
              if (errors.reason) setErrors((x) => ({ ...x, reason: undefined }));
            }}
          />
          {update.isError ? (
            <Alert tone="danger" title="The status was not changed">
              {errorMessage(update.error)}
            </Alert>
          ) : null}
          {done ? <Alert tone="success">{done}</Alert> : null}
          <div>
            <Button type="submit" busy={update.isPending && !confirming}>
              Change status
            </Button>
          </div>
        </form>
      )}
      <ConfirmDialog
        open={confirming}
        title="Cancel this case?"
        confirmLabel="Cancel the case"
        cancelLabel="Keep it open"
        tone="danger"
        busy={update.isPending}
        onConfirm={send}
        onCancel={() => setConfirming(false)}
      >
        <p>The case leaves the open work and its deadlines stop being chased. It can be reopened later, with a reason.</p>
      </ConfirmDialog>
    </section>
  );
}

function AssignForm({ c, me }: { c: WorkspaceCase; me: { id: number } }) {
  const headingId = useId();
  const staff = useStaff();
  const update = useUpdateCase(c.id, "assignee");
  const current = c.assigneeId ?? null;
  const [chosen, setChosen] = useState<string>(current === null ? "" : String(current));
  const [done, setDone] = useState<string | null>(null);

  const save = (assigneeId: number | null) => {
    setDone(null);
    update.mutate(
      { assigneeId },
      {
        onSuccess: () => {
          setChosen(assigneeId === null ? "" : String(assigneeId));
          const name = assigneeId === null ? null : staff.data?.find((s) => s.id === assigneeId)?.name;
          setDone(assigneeId === null ? "The case is now unassigned." : `The case is now assigned to ${name ?? "them"}.`);
        },
      },
    );
  };

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3">
      <h3 id={headingId} className="text-lg font-bold">
        Assign
      </h3>
      {staff.isPending ? (
        <LoadingState className="py-2">Loading staff…</LoadingState>
      ) : staff.isError ? (
        <Alert tone="warning" title="We couldn't load the list of staff">
          {errorMessage(staff.error)}
        </Alert>
      ) : (
        <form
          noValidate
          className="flex flex-col gap-3"
          onSubmit={(e) => {
            e.preventDefault();
            save(chosen === "" ? null : Number(chosen));
          }}
        >
          <Select
            label="Assigned to"
            value={chosen}
            onChange={(e) => {
              setChosen(e.target.value);
              setDone(null);
              update.reset();
            }}
            controlClassName="sm:max-w-xs"
          >
            <option value="">Nobody (unassigned)</option>
            {staff.data.map((s) => (
              <option key={s.id} value={s.id}>
                {s.name}, {isRole(s.role) ? roleLabels[s.role] : s.role}
              </option>
            ))}
          </Select>
          {update.isError ? (
            <Alert tone="danger" title="The assignee was not changed">
              {errorMessage(update.error)}
            </Alert>
          ) : null}
          {done ? <Alert tone="success">{done}</Alert> : null}
          <div className="flex flex-wrap gap-2">
            <Button type="submit" busy={update.isPending} disabled={chosen === (current === null ? "" : String(current))}>
              Save assignee
            </Button>
            {current !== me.id && staff.data.some((s) => s.id === me.id) ? (
              <Button variant="secondary" onClick={() => save(me.id)} disabled={update.isPending}>
                Assign to me
              </Button>
            ) : null}
          </div>
        </form>
      )}
    </section>
  );
}

function HazardForm({ c }: { c: WorkspaceCase }) {
  const headingId = useId();
  const update = useUpdateCase(c.id, "hazard");
  const known = HAZARD_CLASS_CHOICES.some((h) => h.value === c.hazardClass);
  const [value, setValue] = useState<HazardClass | "">(known ? (c.hazardClass as HazardClass) : "");
  const [reason, setReason] = useState("");
  const [errors, setErrors] = useState<{ value?: string; reason?: string }>({});
  const [done, setDone] = useState<string | null>(null);
  const firstRef = useRef<HTMLInputElement>(null);
  const reasonRef = useRef<HTMLTextAreaElement>(null);

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setDone(null);
    const found: typeof errors = {};
    if (!value) found.value = "Choose how serious the hazard is.";
    if (reason.trim().length < 3) found.reason = "Say why the hazard is classified this way.";
    setErrors(found);
    if (found.value) return firstRef.current?.focus();
    if (found.reason) return reasonRef.current?.focus();
    update.mutate(
      { hazardClass: value as HazardClass, reason: reason.trim() },
      {
        onSuccess: () => {
          setDone(`Classified as: ${hazardClassLabel(value)}. The deadlines follow this classification.`);
          setReason("");
        },
      },
    );
  };

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-3">
      <h3 id={headingId} className="text-lg font-bold">
        Classify the hazard
      </h3>
      <p>
        Now: <strong>{hazardClassLabel(c.hazardClass)}</strong>
        {c.hazardClassReason ? <span className="block text-ink-soft">Reason given: {c.hazardClassReason}</span> : null}
      </p>
      <form onSubmit={submit} noValidate className="flex flex-col gap-3">
        <RadioGroup
          legend="How serious is the hazard?"
          hint="The deadlines are worked out from this. An unclassified case is treated as significant."
          options={HAZARD_CLASS_CHOICES}
          value={value}
          onChange={(v) => {
            setValue(v);
            setErrors((x) => ({ ...x, value: undefined }));
            update.reset();
          }}
          error={errors.value}
          inputRef={firstRef}
        />
        <Textarea
          ref={reasonRef}
          label="Reason for this classification"
          rows={2}
          maxLength={2000}
          value={reason}
          error={errors.reason}
          onChange={(e) => {
            setReason(e.target.value);
            if (errors.reason) setErrors((x) => ({ ...x, reason: undefined }));
          }}
        />
        {update.isError ? (
          <Alert tone="danger" title="The classification was not saved">
            {errorMessage(update.error)}
          </Alert>
        ) : null}
        {done ? <Alert tone="success">{done}</Alert> : null}
        <div>
          <Button type="submit" busy={update.isPending}>
            Save classification
          </Button>
        </div>
      </form>
    </section>
  );
}
