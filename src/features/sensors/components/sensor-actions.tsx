import { useId, useState } from "react";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Input } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import type { SensorCredentialsResponse, SensorResponse } from "@/lib/contracts";
import { todayInLondon } from "@/lib/dates";
import { useIssueSensorCredentials, useRemoveSensor, useRevokeSensor } from "../api/change-sensor";
import { SensorCredentials } from "./sensor-credentials";

type Pending = "issue" | "revoke" | "remove" | null;

/** A lead's actions on one sensor, each confirmed first: a new secret, revoke it, mark the sensor removed. */
export function SensorActions({ sensor }: { sensor: SensorResponse }) {
  const [pending, setPending] = useState<Pending>(null);
  const [issued, setIssued] = useState<SensorCredentialsResponse | null>(null);
  const [removedOn, setRemovedOn] = useState(todayInLondon);
  const removedOnId = useId();
  const issue = useIssueSensorCredentials();
  const revoke = useRevokeSensor();
  const remove = useRemoveSensor();
  const close = () => {
    setPending(null);
    issue.reset();
    revoke.reset();
    remove.reset();
  };

  if (issued) return <SensorCredentials result={issued} onDone={() => setIssued(null)} />;
  if (sensor.state === "removed") return null;

  return (
    <div className="flex flex-wrap gap-2">
      <Button size="sm" variant="secondary" onClick={() => setPending("issue")}>
        {sensor.state === "active" ? "Issue a new secret" : "Issue a secret"}
      </Button>
      {sensor.state === "active" ? (
        <Button size="sm" variant="danger" onClick={() => setPending("revoke")}>
          Revoke the secret
        </Button>
      ) : null}
      <Button size="sm" variant="secondary" onClick={() => setPending("remove")}>
        Mark removed
      </Button>

      <ConfirmDialog
        open={pending === "issue"}
        title={`Issue a new secret for ${sensor.serial}?`}
        confirmLabel="Issue the secret"
        busy={issue.isPending}
        error={issue.isError ? errorMessage(issue.error) : null}
        onCancel={close}
        onConfirm={() =>
          issue.mutate(sensor.id, {
            onSuccess: (result) => {
              close();
              setIssued(result);
            },
          })
        }
      >
        {sensor.state === "active"
          ? "The secret it uses now stops working at once, over HTTP and MQTT, until the sensor is given the new one."
          : "The new secret is shown once."}
      </ConfirmDialog>

      <ConfirmDialog
        open={pending === "revoke"}
        title={`Revoke the secret of ${sensor.serial}?`}
        confirmLabel="Revoke the secret"
        tone="danger"
        busy={revoke.isPending}
        error={revoke.isError ? errorMessage(revoke.error) : null}
        onCancel={close}
        onConfirm={() => revoke.mutate(sensor.id, { onSuccess: close })}
      >
        Its readings are refused from now on, over HTTP and MQTT, until a new secret is issued. The readings already stored stay.
      </ConfirmDialog>

      <ConfirmDialog
        open={pending === "remove"}
        title={`Mark ${sensor.serial} removed?`}
        confirmLabel="Mark removed"
        tone="danger"
        busy={remove.isPending}
        error={remove.isError ? errorMessage(remove.error) : null}
        onCancel={close}
        onConfirm={() => remove.mutate({ id: sensor.id, removedOn, version: sensor.version }, { onSuccess: close })}
      >
        <p>Its secret stops working and it cannot be used again; its readings stay with the room.</p>
        <Input
          id={removedOnId}
          className="mt-3 max-w-xs"
          label="Taken out on"
          type="date"
          value={removedOn}
          max={todayInLondon()}
          onChange={(e) => setRemovedOn(e.target.value)}
        />
      </ConfirmDialog>
    </div>
  );
}
