import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import type { OutlookAdviceResponse, OutlookDayResponse, OutlookLineResponse, OutlookRoomResponse } from "@/lib/contracts";
import type { TFunction } from "i18next";
import { formatDateIn } from "@/lib/dates";
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
  // The risk namespace names the surface (its building elements).
  const { t } = useTranslation(["home", "risk"]);
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
          <p className="text-sm text-ink-soft">
            {t("outlook.intro", {
              surface: t(`risk:element.${outlook.surface.elementId}`, { defaultValue: outlook.surface.label }).toLowerCase(),
            })}
          </p>
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
            <li key={line.id}>{lineIn(t, "methodLines", line)}</li>
          ))}
        </ul>
      </details>
    </div>
  );
}

/**
 * A tip, caution or method line in the reader's language, by its id, with its figures as ICU
 * arguments; a line this screen does not know yet (a newer server) shows the English it came with.
 */
function lineIn(t: TFunction, group: "advice" | "methodLines", line: OutlookLineResponse): string {
  return t(`home:outlook.${group}.${line.id}`, { ...line.values, defaultValue: line.text });
}

/** Intl's locale for the reader's language (the pseudo-locales read as English). */
const localeOf = (lng: string) => (lng === "cy" ? "cy" : "en-GB");

/** "Wednesday" (or "Dydd Mercher") for a calendar date, YYYY-MM-DD. */
function weekdayIn(locale: string, date: string): string {
  return new Intl.DateTimeFormat(locale, { weekday: "long", timeZone: "UTC" }).format(new Date(`${date}T00:00:00Z`));
}

function OutlookTable({ outlook }: { outlook: Outlook }) {
  const { t, i18n } = useTranslation("home");
  const locale = localeOf(i18n.language);
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
                {i === 0 ? t("outlook.today") : i === 1 ? t("outlook.tomorrow") : t("date", { when: weekdayIn(locale, date) })}
                <span className="block font-normal text-ink-soft">
                  {t("date", { when: formatDateIn(i18n.language, date, "longDayNoYear") })}
                </span>
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
  const { t, i18n } = useTranslation("home");
  return (
    <ul className="space-y-1 text-sm text-ink-soft">
      {rooms.map((room) => {
        const figures = {
          temperature: fixed(room.indoor.airTemperatureC, 1),
          humidity: fixed(room.indoor.relativeHumidityPct, 0),
        };
        return (
          <li key={room.roomId}>
            <span className="font-semibold text-ink" translate="no">
              {room.name}:
            </span>{" "}
            {room.indoor.source === "sensor"
              ? t("outlook.fromSensor", figures)
              : room.indoor.source === "case-readings"
                ? t("outlook.fromReadings", { ...figures, when: formatDateIn(i18n.language, room.indoor.takenAt, "dateTime") })
                : t("outlook.assumed", figures)}
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
            {lineIn(t, "advice", item)}{" "}
            <span className="text-xs text-ink-soft">
              {t("outlook.basis", { basis: t(`outlook.bases.${item.basisId}`, { defaultValue: item.basis }) })}
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
