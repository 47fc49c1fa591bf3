import type { QueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useParams, type LoaderFunctionArgs } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingState } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { useUser } from "@/features/auth/api/get-me";
import { signedInAs } from "@/features/auth/api/require-role";
import { sensorQueryOptions, useSensor } from "@/features/sensors/api/get-sensor";
import { useSensorReadings } from "@/features/sensors/api/get-sensor-readings";
import { SensorActions } from "@/features/sensors/components/sensor-actions";
import { SensorReadingsChart } from "@/features/sensors/components/sensor-readings-chart";
import { intervalLabel, lastSeen, sensorStateLabels } from "@/features/sensors/components/sensor-state";
import { errorMessage } from "@/lib/api-client";
import { formatDate, formatDateTime } from "@/lib/dates";

const idOf = (raw: string | undefined) => {
  const id = Number(raw);
  return Number.isInteger(id) && id > 0 ? id : 0;
};
const WINDOWS = [
  [24, "24 hours"],
  [24 * 7, "7 days"],
  [24 * 30, "30 days"],
] as const;

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = idOf(params.id);
    if (id && (await signedInAs(queryClient, ["officer", "maintenance", "admin"]))) {
      void queryClient.prefetchQuery(sensorQueryOptions(id));
    }
    return null;
  };

/** One sensor: where it is, when it last reported, its latest readings live, and the lead's actions. */
export default function SensorDevicePage() {
  const id = idOf(useParams().id);
  const user = useUser();
  const [hours, setHours] = useState<number>(24);
  const sensor = useSensor(id);
  const readings = useSensorReadings(id, hours);
  const canChange = user.role === "admin" || user.role === "maintenance";

  if (!id || sensor.isError) {
    return (
      <>
        <title>Sensor not found · Dewline</title>
        <PageHeader title="Sensor not found" />
        <Alert tone="danger" title="We could not open this sensor">
          <p>{id ? errorMessage(sensor.error) : "The link does not name a sensor."}</p>
          <p className="mt-2">
            <TextLink to="/sensors">All sensors</TextLink>
          </p>
        </Alert>
      </>
    );
  }
  if (sensor.isPending) return <LoadingState>Opening the sensor…</LoadingState>;
  const s = sensor.data;
  const latest = readings.data?.points.at(-1);

  return (
    <>
      <title>{`Sensor ${s.serial} · Dewline`}</title>
      <p className="mb-2 text-sm">
        <TextLink to="/sensors">All sensors</TextLink>
      </p>
      <PageHeader title={`Sensor ${s.serial}`} description={`${s.homeAddress} · ${s.roomName} · ${s.placement}`} />
      <div className="flex flex-col gap-5">
        <Panel title="This sensor">
          <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
            <dt className="font-semibold">State</dt>
            <dd>{sensorStateLabels[s.state]}</dd>
            <dt className="font-semibold">Last reading</dt>
            <dd>{lastSeen(s)}</dd>
            <dt className="font-semibold">Model</dt>
            <dd>
              {s.model}
              {s.measuresSurface ? " (with a surface probe)" : ""}
            </dd>
            <dt className="font-semibold">Reports every</dt>
            <dd>{intervalLabel(s.intervalS)}</dd>
            <dt className="font-semibold">Installed</dt>
            <dd>
              {formatDate(s.installedOn)}
              {s.removedOn ? `, removed ${formatDate(s.removedOn)}` : ""}
            </dd>
            <dt className="font-semibold">MQTT topic</dt>
            <dd className="font-mono text-sm">{s.mqttTopic}</dd>
            <dt className="font-semibold">Secret issued</dt>
            <dd>{s.keyIssuedAt ? formatDateTime(s.keyIssuedAt) : "—"}</dd>
          </dl>
          {canChange ? (
            <div className="mt-4">
              <SensorActions sensor={s} />
            </div>
          ) : null}
        </Panel>
        <Panel title="Readings">
          <div className="mb-3 flex flex-wrap gap-3" role="group" aria-label="Window">
            {WINDOWS.map(([h, label]) => (
              <label key={h} className="flex items-center gap-1">
                <input type="radio" name="window" checked={hours === h} onChange={() => setHours(h)} />
                {label}
              </label>
            ))}
          </div>
          {latest ? (
            <p className="mb-3">
              Latest: {latest.airTemperatureC.toFixed(1)} °C air, {latest.relativeHumidityPct.toFixed(0)} % RH
              {latest.surfaceTemperatureC !== null ? `, ${latest.surfaceTemperatureC.toFixed(1)} °C surface` : ""}
              {latest.batteryPct !== null ? `, battery ${latest.batteryPct} %` : ""} ({formatDateTime(latest.takenAt)})
            </p>
          ) : null}
          {readings.isError ? (
            <Alert tone="danger">{errorMessage(readings.error)}</Alert>
          ) : readings.data ? (
            <SensorReadingsChart series={readings.data} />
          ) : (
            <LoadingState>Loading the readings…</LoadingState>
          )}
        </Panel>
      </div>
    </>
  );
}
