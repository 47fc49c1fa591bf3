import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import type { OutlookAdviceResponse, OutlookDayResponse, OutlookRoomResponse } from "@/lib/contracts";
import { formatCalendarLong, formatForTenant } from "@/lib/dates";
import { fixed } from "@/lib/domain/wording";
import { cn } from "@/lib/cn";
import { useMyOutlook, type Outlook } from "../api/get-my-outlook";

type Level = NonNullable<OutlookDayResponse["level"]>;

/**
 * Each level is said in words, with a shape beside it (empty, half, full circle) so nobody has to
 * tell colours apart; the colour only repeats what the words say.
 */
const LEVELS: Record<Level, { words: string; shape: string; className: string }> = {
  unlikely: { words: "Unlikely", shape: "○", className: "border-moss-600 bg-moss-50 text-moss-700" },
  possible: { words: "Possible", shape: "◐", className: "border-ember-400 bg-ember-50 text-ember-800" },
  likely: { words: "Likely", shape: "●", className: "border-rust-600 bg-rust-50 text-rust-700" },
};

/** The tenant's home page card: the next three days' chance of condensation in each room, with tips. */
export function CondensationOutlookCard() {
  const outlook = useMyOutlook();
  const { t } = useTranslation("home");
  return (
    <Panel title={t("outlook.title")} id="home-outlook">
      {outlook.isPending ? (
        <LoadingState>{t("outlook.loading")}</LoadingState>
      ) : outlook.isError ? (
        <Alert tone="danger" title={t("outlook.loadError")}>
          {errorMessage(outlook.error)}
        </Alert>
      ) : (
        <OutlookBody outlook={outlook.data} />
      )}
    </Panel>
  );
}

export function OutlookBody({ outlook }: { outlook: Outlook }) {
  const { t } = useTranslation("home");
  return (
    <div className="flex flex-col gap-4">
      {!outlook.forecastAvailable ? (
        <Alert tone="info" title={t("outlook.noForecastTitle")} live="none">
          {t("outlook.noForecast")}
        </Alert>
      ) : outlook.rooms.length === 0 ? (
        <p className="text-ink-soft">{t("outlook.noRooms")}</p>
      ) : (
        <>
          <p className="text-sm text-ink-soft">{t("outlook.intro", { surface: outlook.surface.label.toLowerCase() })}</p>
          <OutlookTable outlook={outlook} />
          <IndoorNotes rooms={outlook.rooms} />
        </>
      )}

      <AdviceList title={t("outlook.helps")} items={outlook.tips} id="outlook-tips" />
      <AdviceList title={t("outlook.keepInMind")} items={outlook.cautions} id="outlook-cautions" />

      <details className="text-sm text-ink-soft">
        <summary className="cursor-pointer font-semibold text-ink">{t("outlook.method")}</summary>
        <ul className="mt-2 list-disc space-y-1 pl-5">
          {outlook.method.map((line) => (
            <li key={line}>{line}</li>
          ))}
        </ul>
      </details>
    </div>
  );
}

function dayHeading(date: string, index: number): string {
  return index === 0 ? "Today" : index === 1 ? "Tomorrow" : formatCalendarLong(date, false).split(" ")[0]!;
}

function OutlookTable({ outlook }: { outlook: Outlook }) {
  const { t } = useTranslation("home");
  return (
    <div className="overflow-x-auto">
      <table className="w-full border-collapse text-left">
        <caption className="sr-only">{t("outlook.caption")}</caption>
        <thead>
          <tr className="border-b border-line">
            <th scope="col" className="py-2 pr-3 text-sm font-semibold text-ink-soft">
              {t("outlook.room")}
            </th>
            {outlook.dates.map((date, i) => (
              <th key={date} scope="col" className="py-2 pr-3 text-sm font-semibold">
                {dayHeading(date, i)}
                <span className="block font-normal text-ink-soft">{formatCalendarLong(date, false)}</span>
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {outlook.rooms.map((room) => (
            <tr key={room.roomId} className="border-b border-line last:border-b-0">
              <th scope="row" className="py-2 pr-3 font-semibold" translate="no">
                {room.name}
              </th>
              {outlook.dates.map((date) => (
                <td key={date} className="py-2 pr-3 align-top">
                  <DayCell day={room.days.find((d) => d.date === date)} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

function DayCell({ day }: { day: OutlookDayResponse | undefined }) {
  const { t } = useTranslation("home");
  if (!day || day.level === null) return <span className="text-ink-soft">{t("outlook.noDayForecast")}</span>;
  const level = LEVELS[day.level];
  return (
    <div className="flex flex-col gap-1">
      <span
        className={cn(
          "inline-flex w-fit items-center gap-1.5 rounded-full border px-2 py-0.5 text-sm font-semibold",
          level.className,
        )}
      >
        <span aria-hidden="true">{level.shape}</span>
        {t(`outlook.${day.level}`)}
      </span>
      {day.condensingHours > 0 ? (
        <span className="text-xs text-ink-soft">{t("outlook.condensingHours", { hours: day.condensingHours })}</span>
      ) : day.hoursAtOrAbove80 > 0 ? (
        <span className="text-xs text-ink-soft">{t("outlook.humidHours", { hours: day.hoursAtOrAbove80 })}</span>
      ) : null}
    </div>
  );
}

function IndoorNotes({ rooms }: { rooms: OutlookRoomResponse[] }) {
  return (
    <ul className="space-y-1 text-sm text-ink-soft">
      {rooms.map((room) => {
        const figures = `${fixed(room.indoor.airTemperatureC, 1)} °C and ${fixed(room.indoor.relativeHumidityPct, 0)} % humidity`;
        return (
          <li key={room.roomId}>
            <span className="font-semibold text-ink">{room.name}:</span>{" "}
            {room.indoor.source === "sensor"
              ? `from the sensor in the room (${figures}).`
              : room.indoor.source === "case-readings"
                ? `from the readings taken for your report, ${formatForTenant(room.indoor.takenAt)} (${figures}).`
                : `we have no recent readings, so we assumed ${figures}.`}
          </li>
        );
      })}
    </ul>
  );
}

function AdviceList({ title, items, id }: { title: string; items: OutlookAdviceResponse[]; id: string }) {
  const { t } = useTranslation("home");
  return (
    <section aria-labelledby={`${id}-heading`}>
      <h3 id={`${id}-heading`} className="mb-2 text-lg font-bold">
        {title}
      </h3>
      <ul className="list-disc space-y-2 pl-5">
        {items.map((item) => (
          <li key={item.id}>
            {item.text} <span className="text-xs text-ink-soft">{t("outlook.basis", { basis: item.basis })}</span>
          </li>
        ))}
      </ul>
    </section>
  );
}
