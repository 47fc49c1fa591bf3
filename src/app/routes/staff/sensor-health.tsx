import type { QueryClient } from "@tanstack/react-query";
import { PageHeader } from "@/components/ui/page-header";
import { Panel } from "@/components/ui/card";
import { signedInAs } from "@/features/auth/api/require-role";
import { sensorHealthSummaryQueryOptions } from "@/features/sensor-health/api/get-sensor-health-summary";
import { SensorHealthSummary } from "@/features/sensor-health/components/sensor-health-summary";
import { SensorsNeedingAttention } from "@/features/sensor-health/components/sensors-needing-attention";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["officer", "maintenance", "admin"]))
    void queryClient.prefetchQuery(sensorHealthSummaryQueryOptions());
  return null;
};

export default function SensorHealthPage() {
  return (
    <>
      <title>Sensor health · Dewline</title>
      <PageHeader
        title="Sensor health"
        description="Which sensors are working, and which need a visit: offline, a low battery, or values that stay the same or change faster than a room can."
      />
      <div className="flex flex-col gap-4">
        <SensorHealthSummary />
        <Panel title="Sensors needing attention" id="sensors-needing-attention">
          <SensorsNeedingAttention />
        </Panel>
      </div>
    </>
  );
}
