import { languagePreferenceWords } from "@/lib/language-words";
import type { ReactNode } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { LoadingState } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { errorMessage } from "@/lib/api-client";
import { formatCalendarShort, formatDateTime, formatDay } from "@/lib/dates";
import {
  builtFormLabels,
  glazingTypeLabels,
  heatingTypeLabels,
  labelOf,
  roomKindLabels,
  ventilationLabels,
  wallTypeLabels,
  type Property,
} from "@/lib/homes";
import { useHomeCases, useHomeReadings, useHomeTenants } from "../api/get-home-record";

/** Loading, failure (with a retry) and the content, the same way for every part of the page. */
function QueryBlock<T>({
  query,
  what,
  children,
}: {
  query: { isPending: boolean; isError: boolean; error: unknown; data: T | undefined; refetch: () => unknown };
  what: string;
  children: (data: T) => ReactNode;
}) {
  if (query.isPending) return <LoadingState>Loading the {what}…</LoadingState>;
  if (query.isError || query.data === undefined)
    return (
      <Alert tone="danger" title={`We could not load the ${what}`}>
        <p>{errorMessage(query.error)}</p>
        <Button size="sm" variant="secondary" className="mt-2" onClick={() => void query.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  return <>{children(query.data)}</>;
}

function Fact({ term, children }: { term: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-0.5">
      <dt className="text-sm font-semibold text-ink-soft">{term}</dt>
      <dd>{children}</dd>
    </div>
  );
}

/** Address, UPRN, estate and the building's make-up. */
export function HomeFacts({ home }: { home: Property }) {
  return (
    <dl className="grid grid-cols-1 gap-3 sm:grid-cols-2 lg:grid-cols-3">
      <Fact term="Address">
        {[home.addressLine1, home.addressLine2, home.town].filter(Boolean).join(", ")}{" "}
        <span className="whitespace-nowrap">{home.postcode}</span>
      </Fact>
      <Fact term="UPRN">{home.uprn ? <span className="font-mono">{home.uprn}</span> : "Not recorded"}</Fact>
      <Fact term="Estate and block">{[home.estate, home.block].filter(Boolean).join(", ")}</Fact>
      <Fact term="Type of home">{labelOf(builtFormLabels, home.builtForm)}</Fact>
      <Fact term="Walls">{labelOf(wallTypeLabels, home.wallType)}</Fact>
      <Fact term="Glazing">{labelOf(glazingTypeLabels, home.glazingType)}</Fact>
      <Fact term="Heating">{labelOf(heatingTypeLabels, home.heatingType)}</Fact>
      <Fact term="Ventilation">{labelOf(ventilationLabels, home.ventilation)}</Fact>
    </dl>
  );
}

/** The rooms, read only. */
export function HomeRooms({ home }: { home: Property }) {
  if (!home.rooms.length) return <EmptyState title="No rooms recorded">An admin can add the home's rooms.</EmptyState>;
  return (
    <ul className="grid grid-cols-1 gap-2 sm:grid-cols-2">
      {home.rooms.map((r) => (
        <li key={r.id} className="rounded-md border border-line px-3 py-2">
          <span className="font-semibold">{r.name}</span>
          <span className="block text-sm text-ink-soft">{labelOf(roomKindLabels, r.kind)}</span>
        </li>
      ))}
    </ul>
  );
}

/** Everyone with a tenancy of the home, current tenants first. */
export function HomeTenants({ homeId }: { homeId: number }) {
  const tenants = useHomeTenants(homeId);
  return (
    <QueryBlock query={tenants} what="tenants">
      {(data) =>
        data.tenants.length === 0 ? (
          <EmptyState title="No tenants recorded">Nobody has had a tenancy of this home in Dewline.</EmptyState>
        ) : (
          <ul className="flex flex-col gap-2">
            {data.tenants.map((t) => (
              <li
                key={t.tenancyId}
                className="flex flex-wrap items-baseline justify-between gap-2 rounded-md border border-line px-3 py-2"
              >
                <span>
                  <span className="font-semibold">{t.name}</span>{" "}
                  <a href={`mailto:${t.email}`} className="text-sm break-all text-dew-700 underline">
                    {t.email}
                  </a>
                  {languagePreferenceWords(t.language) ? (
                    <span className="block text-sm font-semibold">{languagePreferenceWords(t.language)}</span>
                  ) : null}
                </span>
                <span className="text-sm text-ink-soft">
                  {t.current ? "Current tenant" : "Former tenant"} · from {formatCalendarShort(t.startDate)}
                  {t.endDate ? ` to ${formatCalendarShort(t.endDate)}` : ""}
                </span>
              </li>
            ))}
          </ul>
        )
      }
    </QueryBlock>
  );
}

const channelWords: Record<string, string> = {
  "tenant-online": "Online, by the tenant",
  phone: "Phone call",
  visit: "Visit",
  letter: "Letter",
  email: "E-mail",
  sensor: "Opened from a sensor alert",
};

/** The home's cases, newest first, each opening its workspace. */
export function HomeCases({ homeId, renderStatus }: { homeId: number; renderStatus: (status: string) => ReactNode }) {
  const cases = useHomeCases(homeId);
  return (
    <QueryBlock query={cases} what="cases">
      {(data) =>
        data.cases.length === 0 ? (
          <EmptyState title="No cases yet">No damp or mould report has been made for this home.</EmptyState>
        ) : (
          <ul className="flex flex-col gap-2">
            {data.cases.map((c) => (
              <li key={c.id} className="flex flex-col gap-1 rounded-md border border-line px-3 py-2">
                <div className="flex flex-wrap items-center justify-between gap-2">
                  <TextLink to={`/cases/${c.id}`}>{c.reference ?? `Case ${c.id}`}</TextLink>
                  {renderStatus(c.status)}
                </div>
                <p className="line-clamp-2">{c.description}</p>
                <p className="text-sm text-ink-soft">
                  {channelWords[c.channel] ?? c.channel} · known since {formatDay(c.awareAt)}
                  {c.tenantName ? ` · ${c.tenantName}` : ""}
                </p>
              </li>
            ))}
          </ul>
        )
      }
    </QueryBlock>
  );
}

/** Each room's latest readings over all the home's cases. */
export function HomeReadings({ homeId }: { homeId: number }) {
  const readings = useHomeReadings(homeId);
  return (
    <QueryBlock query={readings} what="readings">
      {(data) =>
        data.rooms.every((r) => r.count === 0) ? (
          <EmptyState title="No readings yet">Readings added to any of this home's cases appear here, room by room.</EmptyState>
        ) : (
          <div className="grid grid-cols-1 gap-3 lg:grid-cols-2">
            {data.rooms.map((r) => (
              <div key={r.room.id} className="overflow-x-auto rounded-md border border-line">
                <table className="w-full border-collapse text-left text-sm">
                  <caption className="px-3 pt-2 pb-1 text-left font-bold">
                    {r.room.name}{" "}
                    <span className="font-normal text-ink-soft">
                      ({r.count === 0 ? "no readings" : `${r.count} ${r.count === 1 ? "reading" : "readings"} in all`})
                    </span>
                  </caption>
                  {r.latest.length ? (
                    <>
                      <thead className="bg-dew-50">
                        <tr>
                          <th scope="col" className="px-3 py-1.5">
                            Taken
                          </th>
                          <th scope="col" className="px-3 py-1.5">
                            Air
                          </th>
                          <th scope="col" className="px-3 py-1.5">
                            Humidity
                          </th>
                          <th scope="col" className="px-3 py-1.5">
                            Surface
                          </th>
                        </tr>
                      </thead>
                      <tbody>
                        {r.latest.map((x) => (
                          <tr key={`${x.caseId}-${x.takenAt}`} className="border-t border-line">
                            <td className="px-3 py-1.5 whitespace-nowrap">{formatDateTime(x.takenAt)}</td>
                            <td className="px-3 py-1.5">{x.airTemperatureC.toFixed(1)} °C</td>
                            <td className="px-3 py-1.5">{Math.round(x.relativeHumidityPct)} %</td>
                            <td className="px-3 py-1.5">
                              {x.surfaceTemperatureC === null ? "—" : `${x.surfaceTemperatureC.toFixed(1)} °C`}
                            </td>
                          </tr>
                        ))}
                      </tbody>
                    </>
                  ) : null}
                </table>
              </div>
            ))}
          </div>
        )
      }
    </QueryBlock>
  );
}
