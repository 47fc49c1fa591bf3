import type { QueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { Link, useParams, type LoaderFunctionArgs } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Button, buttonClasses } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingState } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { useUser } from "@/features/auth/api/get-me";
import { signedInAs } from "@/features/auth/api/require-role";
import { StatusBadge } from "@/features/cases/components/case-status";
import {
  homeCasesQueryOptions,
  homeReadingsQueryOptions,
  homeTenantsQueryOptions,
} from "@/features/properties/api/get-home-record";
import { propertyQueryOptions, useProperty } from "@/features/properties/api/get-property";
import { HomeForm } from "@/features/properties/components/home-form";
import { HomeCases, HomeFacts, HomeReadings, HomeRooms, HomeTenants } from "@/features/properties/components/home-record";
import { RoomsEditor } from "@/features/properties/components/rooms-editor";
import { HomeSensors } from "@/features/sensors/components/home-sensors";
import { errorMessage } from "@/lib/api-client";
import { streetAddress } from "@/lib/homes";

const homeIdOf = (raw: string | undefined) => {
  const id = Number(raw);
  return Number.isInteger(id) && id > 0 ? id : 0;
};

export const clientLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = homeIdOf(params.id);
    if (id && (await signedInAs(queryClient, ["officer", "maintenance", "admin"]))) {
      void queryClient.prefetchQuery(propertyQueryOptions(id));
      void queryClient.prefetchQuery(homeTenantsQueryOptions(id));
      void queryClient.prefetchQuery(homeCasesQueryOptions(id));
      void queryClient.prefetchQuery(homeReadingsQueryOptions(id));
    }
    return null;
  };

const renderStatus = (status: string) => <StatusBadge status={status} audience="staff" className="whitespace-nowrap" />;

/** One home for staff: its details and rooms, tenants, cases and readings; admins edit it here. */
export default function HomePage() {
  const id = homeIdOf(useParams().id);
  const user = useUser();
  const home = useProperty(id || undefined);
  const [editing, setEditing] = useState(false);
  const [saved, setSaved] = useState(false);
  const isAdmin = user.role === "admin";
  const canLog = user.role === "officer" || user.role === "admin";

  if (!id || home.isError) {
    return (
      <>
        <title>Home not found · Dewline</title>
        <PageHeader title="Home not found" />
        <Alert tone="danger" title="We could not open this home">
          <p>{id ? errorMessage(home.error) : "The link does not name a home."}</p>
          <p className="mt-2">
            <TextLink to="/homes">Back to all homes</TextLink>
          </p>
        </Alert>
      </>
    );
  }
  if (home.isPending) return <LoadingState>Opening the home…</LoadingState>;
  const h = home.data;
  const title = streetAddress(h);

  return (
    <>
      <title>{`${title} · Dewline`}</title>
      <p className="mb-2 text-sm">
        <TextLink to="/homes">All homes</TextLink>
      </p>
      <PageHeader
        title={title}
        description={`${h.town} ${h.postcode} · ${[h.estate, h.block].filter(Boolean).join(", ")}`}
        actions={
          canLog ? (
            <Link to={`/log-report?home=${h.id}`} className={buttonClasses("primary")}>
              Log a report for this home
            </Link>
          ) : null
        }
      />
      <div className="flex flex-col gap-5">
        <Panel
          id="home-details"
          title="Details"
          actions={
            isAdmin && !editing ? (
              <Button variant="secondary" size="sm" onClick={() => (setSaved(false), setEditing(true))}>
                Edit details
              </Button>
            ) : null
          }
        >
          {saved ? (
            <Alert tone="success" className="mb-3">
              The home's details were saved.
            </Alert>
          ) : null}
          {editing ? (
            <HomeForm
              home={h}
              onSaved={() => {
                setEditing(false);
                setSaved(true);
              }}
              onCancel={() => setEditing(false)}
            />
          ) : (
            <HomeFacts home={h} />
          )}
        </Panel>
        <Panel id="home-rooms" title="Rooms">
          {isAdmin ? <RoomsEditor home={h} /> : <HomeRooms home={h} />}
        </Panel>
        <Panel id="home-tenants" title="Tenants">
          <HomeTenants homeId={h.id} />
        </Panel>
        <Panel id="home-cases" title="Cases">
          <HomeCases homeId={h.id} renderStatus={renderStatus} />
        </Panel>
        <Panel id="home-readings" title="Recent readings">
          <HomeReadings homeId={h.id} />
        </Panel>
        <Panel id="home-sensors" title="Sensors in this home">
          <HomeSensors propertyId={h.id} />
        </Panel>
      </div>
    </>
  );
}
