import { Panel } from "@/components/ui/card";
import { formatDate } from "@/lib/dates";
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
    <address className="not-italic text-lg leading-relaxed">
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
  return (
    <div className="flex flex-col gap-4">
      <Panel title="Your address" id="home-address">
        <HomeAddress property={property} />
        <dl className="mt-4 grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-2">
          <Detail term="Estate" value={property.block ? `${property.estate}, ${property.block}` : property.estate} />
          <Detail term="Tenancy started" value={formatDate(tenancy.startDate)} />
          {tenancy.endDate ? <Detail term="Tenancy ends" value={formatDate(tenancy.endDate)} /> : null}
        </dl>
      </Panel>

      <Panel title="Rooms" id="home-rooms">
        {property.rooms.length === 0 ? (
          <p className="text-ink-soft">No rooms are listed for your home yet. Your landlord's team can add them.</p>
        ) : (
          <ul className="grid grid-cols-1 gap-2 sm:grid-cols-2">
            {property.rooms.map((room) => (
              <li
                key={room.id}
                className="flex items-center justify-between gap-3 rounded-md border border-line bg-paper px-3 py-3"
              >
                <span className="font-semibold">{room.name}</span>
                {showKind(room.name, room.kind) ? (
                  <span className="text-sm text-ink-soft">{labelOf(roomKindLabels, room.kind)}</span>
                ) : null}
              </li>
            ))}
          </ul>
        )}
      </Panel>

      <Panel title="About the building" id="home-building">
        <dl className="grid grid-cols-1 gap-x-6 gap-y-3 sm:grid-cols-2">
          <Detail term="Type of home" value={labelOf(builtFormLabels, property.builtForm)} />
          <Detail term="Walls" value={labelOf(wallTypeLabels, property.wallType)} />
          <Detail term="Windows" value={labelOf(glazingTypeLabels, property.glazingType)} />
          <Detail term="Heating" value={labelOf(heatingTypeLabels, property.heatingType)} />
        </dl>
        <p className="mt-3 text-sm text-ink-soft">
          If any of this looks wrong, tell your housing officer: it helps them understand damp in your home.
        </p>
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

function Detail({ term, value }: { term: string; value: string }) {
  return (
    <div>
      <dt className="text-sm font-semibold text-ink-soft">{term}</dt>
      <dd className="text-base">{value}</dd>
    </div>
  );
}
