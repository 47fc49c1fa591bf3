import { TextLink } from "@/components/ui/text-link";
import { Spinner } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import { useHomeSensors } from "../api/get-home-sensors";
import { lastSeen, sensorStateLabels } from "./sensor-state";

/** "Sensors in this home": each sensor with its room, state and last reading. */
export function HomeSensors({ propertyId }: { propertyId: number }) {
  const sensors = useHomeSensors(propertyId);
  if (sensors.isPending) return <Spinner size="sm" label="Loading the sensors" />;
  if (sensors.isError) return <p className="text-rust-700">{errorMessage(sensors.error)}</p>;
  const items = sensors.data.items.filter((s) => s.state !== "removed");
  if (items.length === 0) return <p className="text-ink-soft">No sensors are fitted in this home.</p>;
  return (
    <ul className="flex flex-col gap-2">
      {items.map((s) => (
        <li key={s.id}>
          <TextLink to={`/sensors/${s.id}`}>
            {s.roomName}: {s.serial}
          </TextLink>
          <span className="text-ink-soft">
            {" "}
            · {sensorStateLabels[s.state]} · last reading {lastSeen(s)}
          </span>
        </li>
      ))}
    </ul>
  );
}
