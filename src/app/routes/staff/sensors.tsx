import type { QueryClient } from "@tanstack/react-query";
import { useSearchParams, type LoaderFunctionArgs } from "react-router-dom";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { useUser } from "@/features/auth/api/get-me";
import { signedInAs } from "@/features/auth/api/require-role";
import { useProperty } from "@/features/properties/api/get-property";
import { PropertyPicker } from "@/features/properties/components/property-picker";
import { sensorsQueryOptions } from "@/features/sensors/api/get-sensors";
import { RegisterSensorForm } from "@/features/sensors/components/register-sensor-form";
import { SensorsTable } from "@/features/sensors/components/sensors-table";
import { sensorsFiltersFrom } from "@/features/sensors/hooks/use-sensors-table-params";
import { usePatchSearchParams } from "@/lib/search-params";

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ request }: LoaderFunctionArgs) => {
    if (await signedInAs(queryClient, ["officer", "maintenance", "admin"])) {
      void queryClient.prefetchQuery(sensorsQueryOptions(sensorsFiltersFrom(new URL(request.url).searchParams)));
    }
    return null;
  };

/** The landlord's sensors; leads (admin, maintenance) register new ones here. */
export default function SensorsPage() {
  const user = useUser();
  const canChange = user.role === "admin" || user.role === "maintenance";
  const [params] = useSearchParams();
  const patch = usePatchSearchParams();
  const homeId = Number(params.get("home")) || undefined;
  const home = useProperty(homeId);

  return (
    <>
      <title>Sensors · Dewline</title>
      <PageHeader
        title="Sensors"
        description="Temperature and humidity sensors fitted in your homes, and when each last sent a reading."
      />
      <div className="flex flex-col gap-5">
        <Panel as="div">
          <SensorsTable />
        </Panel>
        {canChange ? (
          <Panel title="Register a sensor">
            <div className="flex flex-col gap-4">
              <PropertyPicker value={homeId} onChange={(id) => patch({ home: id ?? null, page: 1 })} />
              <RegisterSensorForm
                key={home.data?.id ?? 0}
                home={home.data ? { id: home.data.id, addressLine1: home.data.addressLine1, rooms: home.data.rooms } : null}
              />
            </div>
          </Panel>
        ) : null}
      </div>
    </>
  );
}
