import { Link } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { LoadingState } from "@/components/ui/spinner";
import { textLinkClasses } from "@/components/ui/text-link";
import { errorMessage } from "@/lib/api-client";
import { SENSOR_PROBLEMS } from "@/lib/contracts";
import { formatDateTime } from "@/lib/dates";
import { useSensorHealthSummary } from "../api/get-sensor-health-summary";
import { sensorProblemLabels } from "./sensor-problem-labels";

const plural = (n: number, one: string, many: string) => `${n} ${n === 1 ? one : many}`;

/**
 * The lead's summary of the landlord's sensors in use: how many work, how many need attention and
 * for what; each count opens the list of those sensors.
 */
export function SensorHealthSummary({ headingLevel = 2 }: { headingLevel?: 2 | 3 }) {
  const summary = useSensorHealthSummary();
  return (
    <Panel title="Sensor health" id="sensor-health-summary" headingLevel={headingLevel}>
      {summary.isPending ? (
        <LoadingState>Counting the sensors…</LoadingState>
      ) : summary.isError ? (
        <Alert tone="danger" title="We could not count the sensors">
          {errorMessage(summary.error)}
        </Alert>
      ) : summary.data.total === 0 ? (
        <p className="text-ink-soft">No sensors are in use yet. Sensors appear here once they are registered.</p>
      ) : (
        <div className="flex flex-col gap-3">
          <p>
            {plural(summary.data.total, "sensor", "sensors")} in use: {summary.data.ok} working,{" "}
            <strong>{summary.data.needingAttention} needing attention</strong>.
          </p>
          <dl className="grid grid-cols-2 gap-x-6 gap-y-2 sm:grid-cols-4">
            {SENSOR_PROBLEMS.map((p) => (
              <div key={p} className="flex flex-col">
                <dt className="text-sm text-ink-soft">{sensorProblemLabels[p]}</dt>
                <dd className="text-lg font-semibold">
                  {summary.data.counts[p] > 0 ? (
                    <Link
                      to={`/sensors/health?problem=${p}`}
                      className={textLinkClasses}
                      aria-label={`${sensorProblemLabels[p]}: ${plural(summary.data.counts[p], "sensor", "sensors")}, show them`}
                    >
                      {summary.data.counts[p]}
                    </Link>
                  ) : (
                    0
                  )}
                </dd>
              </div>
            ))}
          </dl>
          <p className="text-sm text-ink-soft">
            Offline is as of {formatDateTime(summary.data.at)}.
            {summary.data.oldestCheckAt
              ? ` Battery, flat-lined and jumping values are checked as readings arrive (oldest check ${formatDateTime(summary.data.oldestCheckAt)}).`
              : " Battery, flat-lined and jumping values are checked as readings arrive."}
          </p>
        </div>
      )}
    </Panel>
  );
}
