import { useEffect, useId, useRef, useState, type ReactNode } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Input, Select } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import type { UserAuditEntry } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { isRole, roleLabels, STAFF_ROLES, type Role } from "@/lib/roles";
import { personNameSchema } from "@/lib/schemas/users";
import { useUserHistory } from "../api/get-user-history";
import { useCancelInvitation, useResendInvitation } from "../api/invitation-actions";
import type { ManagedUser } from "../api/types";
import { useUpdateUser } from "../api/update-user";
import { StatusBadge } from "./status-badge";

type Pending =
  | { kind: "edit"; name: string; role: Role }
  | { kind: "resend" }
  | { kind: "cancel" }
  | { kind: "status"; status: "active" | "disabled" };

const roleName = (value: string | null) => (value && isRole(value) ? roleLabels[value] : (value ?? ""));

/** One line of an account's history in plain words. */
export function describeAuditEntry(e: UserAuditEntry): string {
  const who = e.actor?.name ?? "Someone";
  switch (e.action) {
    case "invited":
      return `${who} sent an invitation${e.to ? ` as ${roleName(e.to).toLowerCase()}` : ""}.`;
    case "invitation-resent":
      return `${who} sent the invitation again with a new link.`;
    case "invitation-cancelled":
      return `${who} cancelled the invitation.`;
    case "invitation-accepted":
      return "They accepted the invitation and chose a password.";
    case "name-changed":
      return `${who} changed the name from “${e.from ?? ""}” to “${e.to ?? ""}”.`;
    case "role-changed":
      return `${who} changed the role from ${roleName(e.from).toLowerCase()} to ${roleName(e.to).toLowerCase()}.`;
    case "disabled":
      return `${who} disabled the account.`;
    case "enabled":
      return `${who} enabled the account again.`;
  }
}

function History({ userId }: { userId: number }) {
  const history = useUserHistory(userId);
  if (history.isPending) return <LoadingState>Loading the history…</LoadingState>;
  if (history.isError) return <Alert tone="danger">{errorMessage(history.error)}</Alert>;
  if (!history.data.entries.length) return <p className="text-ink-soft">Nothing recorded yet.</p>;
  return (
    <ol className="flex flex-col gap-2">
      {history.data.entries.map((e) => (
        <li key={e.id} className="flex flex-col border-l-2 border-line pl-3">
          <span>{describeAuditEntry(e)}</span>
          <span className="text-sm text-ink-soft">{formatDateTime(e.at)}</span>
        </li>
      ))}
    </ol>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-3 border-t border-line pt-4">
      <h4 className="text-base font-bold">{title}</h4>
      {children}
    </div>
  );
}

interface UserDetailProps {
  user: ManagedUser;
  currentUserId: number;
  onClose: () => void;
  /** The account as the server now has it, after a change made here. */
  onChanged: (user: ManagedUser) => void;
}

/**
 * One person's account, for an admin: name and role, the pending invitation (send again or cancel),
 * disabling and enabling, and the history of who changed what. Every change is confirmed first.
 */
export function UserDetail({ user, currentUserId, onClose, onChanged }: UserDetailProps) {
  const headingRef = useRef<HTMLHeadingElement>(null);
  const headingId = useId();
  const update = useUpdateUser();
  const resend = useResendInvitation();
  const cancel = useCancelInvitation();
  const [pending, setPending] = useState<Pending | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [name, setName] = useState(user.name);
  const [role, setRole] = useState<Role>(user.role);
  const [nameError, setNameError] = useState<string | undefined>();

  useEffect(() => headingRef.current?.focus(), [user.id]);

  const self = user.id === currentUserId;
  const cancelled = user.status === "cancelled";
  const staff = user.role !== "tenant";
  const busy = update.isPending || resend.isPending || cancel.isPending;
  const failure = update.error ?? resend.error ?? cancel.error;

  const ask = (p: Pending) => {
    setDone(null);
    update.reset();
    resend.reset();
    cancel.reset();
    setPending(p);
  };

  const askToSave = () => {
    const parsed = personNameSchema.safeParse(name);
    if (!parsed.success) {
      setNameError(parsed.error.issues[0]?.message);
      return;
    }
    setNameError(undefined);
    if (parsed.data === user.name && role === user.role) {
      setDone("Nothing to save: the name and role are as they were.");
      return;
    }
    ask({ kind: "edit", name: parsed.data, role });
  };

  const finish = (message: string, changed?: ManagedUser) => {
    setPending(null);
    setDone(message);
    if (changed) onChanged(changed);
  };

  const confirm = () => {
    if (!pending) return;
    if (pending.kind === "edit") {
      const changes = {
        ...(pending.name !== user.name ? { name: pending.name } : {}),
        ...(pending.role !== user.role ? { role: pending.role } : {}),
      };
      update.mutate({ id: user.id, ...changes }, { onSuccess: (u) => finish(`${u.name}'s details are saved.`, u) });
    } else if (pending.kind === "status") {
      update.mutate(
        { id: user.id, status: pending.status },
        {
          onSuccess: (u) => finish(`${u.name}'s account is now ${u.status === "active" ? "enabled" : "disabled"}.`, u),
        },
      );
    } else if (pending.kind === "resend") {
      resend.mutate(user.id, {
        onSuccess: (r) =>
          finish(`The invitation went to ${user.email} again. The new link works until ${formatDateTime(r.expiresAt)}.`),
      });
    } else {
      cancel.mutate(user.id, {
        onSuccess: () => finish(`${user.name}'s invitation is cancelled.`, { ...user, status: "cancelled" }),
      });
    }
  };

  const dialog = (() => {
    if (!pending) return null;
    switch (pending.kind) {
      case "edit":
        return {
          title: `Save changes to ${user.name}'s account?`,
          confirmLabel: "Save changes",
          tone: "primary" as const,
          body: (
            <ul className="list-disc pl-5">
              {pending.name !== user.name ? (
                <li>
                  Name: {user.name} → {pending.name}
                </li>
              ) : null}
              {pending.role !== user.role ? (
                <li>
                  Role: {roleLabels[user.role]} → {roleLabels[pending.role]}. What they can see and do changes the next time they
                  open a page.
                </li>
              ) : null}
            </ul>
          ),
        };
      case "resend":
        return {
          title: `Send ${user.name}'s invitation again?`,
          confirmLabel: "Send it again",
          tone: "primary" as const,
          body: <p>A new e-mail goes to {user.email} with a new link. The link in the earlier e-mail stops working.</p>,
        };
      case "cancel":
        return {
          title: `Cancel ${user.name}'s invitation?`,
          confirmLabel: "Cancel the invitation",
          cancelLabel: "Keep it",
          tone: "danger" as const,
          body: (
            <p>
              The link in their e-mail stops working and no account is opened for {user.email}. You can invite them again later
              with the form on this page.
            </p>
          ),
        };
      case "status":
        return pending.status === "disabled"
          ? {
              title: `Disable ${user.name}'s account?`,
              confirmLabel: "Disable account",
              tone: "danger" as const,
              body: (
                <p>
                  {user.name} ({user.email}) is signed out at once and cannot sign in until you enable the account again. Nothing
                  they have recorded is deleted.
                </p>
              ),
            }
          : {
              title: `Enable ${user.name}'s account?`,
              confirmLabel: "Enable account",
              tone: "primary" as const,
              body: (
                <p>
                  {user.name} ({user.email}) will be able to sign in again with their existing password.
                </p>
              ),
            };
    }
  })();

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-4 rounded-lg border border-line-strong bg-paper p-4">
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="flex min-w-0 flex-col gap-1">
          <h3 id={headingId} ref={headingRef} tabIndex={-1} className="text-lg font-bold break-words outline-none">
            {user.name}
          </h3>
          <p className="break-all text-ink-soft">{user.email}</p>
          <p className="flex flex-wrap items-center gap-2">
            <span>{roleLabels[user.role]}</span>
            <StatusBadge status={user.status} />
          </p>
        </div>
        <Button size="sm" variant="secondary" onClick={onClose}>
          Close
        </Button>
      </div>

      {done ? <Alert tone="success">{done}</Alert> : null}

      {cancelled ? (
        <p>This invitation was cancelled. To give them an account, invite them again with the form on this page.</p>
      ) : (
        <Section title="Name and role">
          <Input label="Name" autoComplete="off" value={name} error={nameError} onChange={(e) => setName(e.target.value)} />
          {staff ? (
            <Select
              label="Role"
              value={role}
              disabled={self}
              hint={self ? "You cannot change your own role. Another administrator can do it for you." : undefined}
              onChange={(e) => isRole(e.target.value) && setRole(e.target.value)}
              className="max-w-xs"
            >
              {STAFF_ROLES.map((r) => (
                <option key={r} value={r}>
                  {roleLabels[r]}
                </option>
              ))}
            </Select>
          ) : (
            <p className="text-ink-soft">A tenant's account stays a tenant's: staff roles are for staff accounts.</p>
          )}
          <div>
            <Button size="sm" onClick={askToSave}>
              Save changes
            </Button>
          </div>
        </Section>
      )}

      {user.status === "invited" ? (
        <Section title="Invitation">
          <p>They have not accepted their invitation yet.</p>
          <div className="flex flex-wrap gap-2">
            <Button size="sm" variant="secondary" onClick={() => ask({ kind: "resend" })}>
              Send the invitation again
            </Button>
            <Button size="sm" variant="danger" onClick={() => ask({ kind: "cancel" })}>
              Cancel the invitation
            </Button>
          </div>
        </Section>
      ) : null}

      {(user.status === "active" || user.status === "disabled") && !self ? (
        <Section title="Signing in">
          <p>
            {user.status === "active"
              ? "They can sign in. Disabling the account signs them out at once."
              : "The account is disabled: they cannot sign in."}
          </p>
          <div>
            {user.status === "active" ? (
              <Button size="sm" variant="danger" onClick={() => ask({ kind: "status", status: "disabled" })}>
                Disable account
              </Button>
            ) : (
              <Button size="sm" variant="secondary" onClick={() => ask({ kind: "status", status: "active" })}>
                Enable account
              </Button>
            )}
          </div>
        </Section>
      ) : null}

      <Section title="History">
        <History userId={user.id} />
      </Section>

      <ConfirmDialog
        open={dialog !== null}
        title={dialog?.title ?? ""}
        confirmLabel={dialog?.confirmLabel ?? ""}
        cancelLabel={dialog && "cancelLabel" in dialog ? dialog.cancelLabel : "Cancel"}
        tone={dialog?.tone}
        busy={busy}
        error={failure ? errorMessage(failure) : null}
        onConfirm={confirm}
        onCancel={() => setPending(null)}
      >
        {dialog?.body}
      </ConfirmDialog>
    </section>
  );
}
