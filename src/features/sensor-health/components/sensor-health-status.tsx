import { Alert } from "@/components/ui/alert";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { formatDateTime } from "@/lib/dates";
import { useSensorHealth } from "../api/get-sensor-health";
import { SensorHealthBadge } from "./sensor-health-badge";
import { sensorProblemHelp, sensorProblemLabels } from "./sensor-problem-labels";

/** One sensor's health for its own page: the badge, then each problem with since when, why and what to do. */
export function SensorHealthStatus({ sensorId }: { sensorId: number }) {
  const health = useSensorHealth(sensorId);
  if (health.isPending) return <LoadingState>Checking the sensor…</LoadingState>;
  if (health.isError)
    return (
      <Alert tone="danger" title="We could not check the sensor">
        {errorMessage(health.error)}
      </Alert>
    );
  const { findings, lastReadingAt, checkedAt } = health.data;
  return (
    <div className="flex flex-col gap-2">
      <SensorHealthBadge problems={findings.map((f) => f.problem)} />
      {findings.length > 0 ? (
        <ul className="flex flex-col gap-1.5">
          {findings.map((f) => (
            <li key={f.problem} className="text-sm">
              <span className="font-semibold">{sensorProblemLabels[f.problem]}</span> since {formatDateTime(f.since)}. {f.reason}{" "}
              {sensorProblemHelp[f.problem]}
            </li>
          ))}
        </ul>
      ) : null}
      <p className="text-sm text-ink-soft">
        {lastReadingAt ? `Last reading ${formatDateTime(lastReadingAt)}.` : "No reading yet."} Checked {formatDateTime(checkedAt)}
        .
      </p>
    </div>
  );
}
