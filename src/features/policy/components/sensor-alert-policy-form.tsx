import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { ApiError, errorMessage } from "@/lib/api-client";
import type { SensorAlertPolicyResponse } from "@/lib/contracts";
import { DEFAULT_SENSOR_ALERT_SETTINGS } from "@/lib/domain/sensor-alerts";
import {
  useResetSensorAlertPolicy,
  useSensorAlertPolicy,
  useUpdateSensorAlertPolicy,
  type SensorAlertRules,
} from "../api/sensor-alert-policy";

const FIELDS: { name: keyof SensorAlertRules; label: string; hint: string }[] = [
  {
    name: "mouldIndexAtLeast",
    label: "Mould growth index at least",
    hint: "On the 0–6 scale of the mould growth model; 1 is the first microscopic growth.",
  },
  { name: "hoursAt80In7Days", label: "Hours at 80 % surface humidity or more, in 7 days", hint: "Out of 168 hours." },
  { name: "condensingDaysIn7Days", label: "Days with condensation, of the last 7", hint: "Any condensing on a day counts it." },
  { name: "cooldownDays", label: "Days before the same rule alerts again for a room", hint: "While it keeps holding." },
];

/** The landlord's sensor alert rules, with our own defaults (no standard sets them). */
export function SensorAlertPolicyForm() {
  const policy = useSensorAlertPolicy();
  if (policy.isPending) return <LoadingState>Loading your sensor alert rules…</LoadingState>;
  if (policy.isError) return <Alert tone="danger">{errorMessage(policy.error)}</Alert>;
  return <Editor key={JSON.stringify(policy.data)} policy={policy.data} />;
}

function Editor({ policy }: { policy: SensorAlertPolicyResponse }) {
  const update = useUpdateSensorAlertPolicy();
  const reset = useResetSensorAlertPolicy();
  const [values, setValues] = useState(() => Object.fromEntries(FIELDS.map((f) => [f.name, String(policy[f.name])])));
  const [saved, setSaved] = useState(false);
  const errors = update.error instanceof ApiError && update.error.status === 400 ? update.error.fieldErrors : [];
  const errorOf = (name: string) => errors.find((e) => e.field === name)?.message;
  const ours = DEFAULT_SENSOR_ALERT_SETTINGS;

  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={(e) => {
        e.preventDefault();
        setSaved(false);
        const rules = Object.fromEntries(FIELDS.map((f) => [f.name, Number(values[f.name])])) as unknown as SensorAlertRules;
        update.mutate(rules, { onSuccess: () => setSaved(true) });
      }}
    >
      <Alert
        tone="info"
        live="none"
        title={policy.source === "landlord" ? "Your own rules are in force" : "Our default rules are in force"}
      >
        A room alerts when any rule holds. Our defaults are our own choice, not a standard: mould index {ours.mouldIndexAtLeast},{" "}
        {ours.hoursAt80In7Days} hours at 80 % in 7 days, condensation on {ours.condensingDaysIn7Days} of 7 days, and{" "}
        {ours.cooldownDays} days before a rule alerts again.
      </Alert>
      {saved ? <Alert tone="success">Saved. Each room is judged by these rules from its next readings.</Alert> : null}
      {update.isError && errors.length === 0 ? <Alert tone="danger">{errorMessage(update.error)}</Alert> : null}
      {FIELDS.map((f) => (
        <Input
          key={f.name}
          label={f.label}
          hint={f.hint}
          inputMode="decimal"
          value={values[f.name]}
          error={errorOf(f.name)}
          onChange={(e) => setValues({ ...values, [f.name]: e.target.value })}
        />
      ))}
      <div className="flex gap-3">
        <Button type="submit" busy={update.isPending}>
          Save the alert rules
        </Button>
        {policy.source === "landlord" ? (
          <Button type="button" variant="secondary" busy={reset.isPending} onClick={() => reset.mutate()}>
            Go back to our defaults
          </Button>
        ) : null}
      </div>
    </form>
  );
}
