import { useNavigate, useSearchParams } from "react-router-dom";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { useHomeTenants } from "@/features/properties/api/get-home-record";
import { useProperty } from "@/features/properties/api/get-property";
import { PropertyPicker } from "@/features/properties/components/property-picker";
import { StaffReportForm } from "@/features/report/components/staff-report-form";
import { useState } from "react";

/** Officers and admins log a report that came in by phone, visit, letter or e-mail. */
export default function LogReportPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const fromLink = Number(params.get("home"));
  const [homeId, setHomeId] = useState<number | undefined>(Number.isInteger(fromLink) && fromLink > 0 ? fromLink : undefined);
  const home = useProperty(homeId);
  const tenants = useHomeTenants(homeId);

  return (
    <>
      <title>Log a report · Dewline</title>
      <PageHeader
        title="Log a report"
        description="For a report that came in by phone, in person, by letter or by e-mail. It joins the queue like a tenant's own report."
      />
      <Panel as="div">
        <StaffReportForm
          home={homeId && home.data ? { id: homeId, rooms: home.data.rooms } : undefined}
          homePicker={(error) => <PropertyPicker value={homeId} onChange={setHomeId} error={error} label="Home" />}
          tenants={tenants.data?.tenants}
          tenantsLoading={homeId !== undefined && tenants.isPending}
          onCreated={(created) => void navigate(`/cases/${created.id}`)}
        />
      </Panel>
    </>
  );
}
