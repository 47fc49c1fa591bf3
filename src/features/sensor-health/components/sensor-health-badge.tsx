import { cn } from "@/lib/cn";
import { SENSOR_PROBLEMS, type SensorProblemName } from "@/lib/contracts";
import { sensorProblemLabels } from "./sensor-problem-labels";

const problemClasses: Record<SensorProblemName, string> = {
  offline: "bg-paper text-rust-700 border-rust-600",
  "low-battery": "bg-ember-50 text-ember-800 border-ember-800",
  "flat-lined": "bg-dew-50 text-dew-800 border-dew-500",
  jumping: "bg-dew-50 text-dew-800 border-dew-500",
};

const pill = "inline-flex w-fit items-center rounded-pill border px-2 py-0.5 text-xs font-semibold whitespace-nowrap";

/**
 * A sensor's state in words: "Working", or each of its problems. For lists of sensors (the registry's
 * list mounts it with the problems of `GET /api/sensor-health/devices` or `/:id`).
 */
export function SensorHealthBadge({ problems, className }: { problems: readonly SensorProblemName[]; className?: string }) {
  if (problems.length === 0)
    return <span className={cn(pill, "border-moss-600 bg-moss-50 text-moss-700", className)}>Working</span>;
  const ordered = SENSOR_PROBLEMS.filter((p) => problems.includes(p));
  return (
    <span className={cn("flex flex-wrap gap-1", className)}>
      {ordered.map((p) => (
        <span key={p} className={cn(pill, problemClasses[p])}>
          {sensorProblemLabels[p]}
        </span>
      ))}
    </span>
  );
}
