import { useTranslation } from "react-i18next";
import { Panel } from "@/components/ui/card";
import { useFormatDate } from "@/lib/i18n/use-format-date";
import {
  builtFormLabels,
  glazingTypeLabels,
  heatingTypeLabels,
  labelOf,
  roomKindLabels,
  wallTypeLabels,
  type Property,
  type RoomKind,
} from "@/lib/homes";
import type { MyHome } from "../api/get-my-home";

export function HomeAddress({ property }: { property: Property }) {
  return (
    <address className="not-italic text-lg leading-relaxed" translate="no">
      {property.addressLine1}
      <br />
      {property.addressLine2 ? (
        <>
          {property.addressLine2}
          <br />
        </>
      ) : null}
      {property.town}
      <br />
      {property.postcode}
    </address>
  );
}

export function HomeSummary({ home }: { home: MyHome }) {
  const { property, tenancy } = home;
  const { t } = useTranslation("home");
  const formatDate = useFormatDate();
  // The value's words in the reader's language; a value added on the server since shows as it came.
  const word = (group: string, labels: Record<string, string>, value: string | null) =>
    value ? t(`${group}.${value}`, { defaultValue: labelOf(labels, value) }) : "";
  return (
    <div className="flex flex-col gap-4">
      <Panel title={t("summary.address")} id="home-address">
        <HomeAddress property={property} />
        <dl className="mt-4 grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-2">
          <Detail
            term={t("summary.estate")}
            value={property.block ? `${property.estate}, ${property.block}` : property.estate}
            data
          />
          <Detail term={t("summary.tenancyStarted")} value={formatDate(tenancy.startDate)} />
          {tenancy.endDate ? <Detail term={t("summary.tenancyEnds")} value={formatDate(tenancy.endDate)} /> : null}
        </dl>
      </Panel>

      <Panel title={t("summary.rooms")} id="home-rooms">
        {property.rooms.length === 0 ? (
          <p className="text-ink-soft">{t("summary.noRooms")}</p>
        ) : (
          <ul className="grid grid-cols-1 gap-2 sm:grid-cols-2">
            {property.rooms.map((room) => (
              <li
                key={room.id}
                className="flex items-center justify-between gap-3 rounded-md border border-line bg-paper px-3 py-3"
              >
                <span className="font-semibold" translate="no">
                  {room.name}
                </span>
                {showKind(room.name, room.kind) ? (
                  <span className="text-sm text-ink-soft">{word("roomKind", roomKindLabels, room.kind)}</span>
                ) : null}
              </li>
            ))}
          </ul>
        )}
      </Panel>

      <Panel title={t("summary.building")} id="home-building">
        <dl className="grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-2">
          <Detail term={t("summary.builtForm")} value={word("builtForm", builtFormLabels, property.builtForm)} />
          <Detail term={t("summary.walls")} value={word("wallType", wallTypeLabels, property.wallType)} />
          <Detail term={t("summary.windows")} value={word("glazingType", glazingTypeLabels, property.glazingType)} />
          <Detail term={t("summary.heating")} value={word("heatingType", heatingTypeLabels, property.heatingType)} />
        </dl>
        <p className="mt-3 text-sm text-ink-soft">{t("summary.wrong")}</p>
      </Panel>
    </div>
  );
}

/** "Bedroom 1" already says it is a bedroom; "Box room" does not. */
function showKind(name: string, kind: RoomKind): boolean {
  if (kind === "other") return false;
  const label = labelOf(roomKindLabels, kind).toLowerCase();
  return !name.toLowerCase().startsWith(label.split(" ")[0]!);
}

/** `data`: the value is the landlord's own record (an estate's name), not words to translate. */
function Detail({ term, value, data = false }: { term: string; value: string; data?: boolean }) {
  return (
    <div>
      <dt className="text-sm font-semibold text-ink-soft">{term}</dt>
      <dd className="text-base" translate={data ? "no" : undefined}>
        {value}
      </dd>
    </div>
  );
}
