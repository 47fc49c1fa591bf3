// What the calculator's figures mean, in plain words.
import { useId } from "react";
import { BORDERLINE_SURFACE_RH_PCT, CRITICAL_TEMPERATURE_FACTOR, MOULD_SURFACE_RH_PCT } from "@/lib/domain";

export function AboutTheNumbers() {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="max-w-reading">
      <h2 id={headingId} className="text-xl font-bold">
        What the numbers mean
      </h2>
      <dl className="mt-2 flex flex-col gap-3">
        <div>
          <dt className="font-bold">Dew point</dt>
          <dd>
            Air carries water as an invisible vapour, and warm air can carry more than cold air. Cool the room's air down and, at
            some temperature, it cannot carry all of its water any more: that temperature is its dew point. A window or wall
            colder than the dew point takes the extra water out of the air, and it gathers as condensation.
          </dd>
        </div>
        <div>
          <dt className="font-bold">Frost point</dt>
          <dd>
            Below freezing, the water in the air settles on a cold surface as frost instead. It starts a little above the dew
            point, at the frost point, which the calculator shows whenever the dew point is below 0 °C. Humidity readings are
            taken as relative to water even below 0 °C, as weather services and most hygrometers give them.
          </dd>
        </div>
        <div>
          <dt className="font-bold">Relative humidity at the surface</dt>
          <dd>
            A cold surface cools the thin layer of air touching it, so that air is damper, relative to what it could hold, than
            the air in the middle of the room. Mould can grow where this surface humidity stays at {MOULD_SURFACE_RH_PCT} % or
            more for weeks (ISO 13788 judges it on a monthly average); at 100 % water condenses. Dewline marks{" "}
            {BORDERLINE_SURFACE_RH_PCT}–{MOULD_SURFACE_RH_PCT} % as borderline: that early warning is our own, not a standard's.
          </dd>
        </div>
        <div>
          <dt className="font-bold">Temperature factor</dt>
          <dd>
            How well a surface keeps the room's warmth: 0 means as cold as outdoors, 1 as warm as the room. It needs the outdoor
            temperature. BRE Information Paper IP 1/06 looks for at least {CRITICAL_TEMPERATURE_FACTOR} on the inside surfaces of
            homes; lower than that, a surface runs cold enough in winter for mould.
          </dd>
        </div>
        <div>
          <dt className="font-bold">Absolute humidity</dt>
          <dd>How many grams of water vapour there are in each cubic metre of the room's air, whatever its temperature.</dd>
        </div>
      </dl>
      <p className="mt-3 text-sm text-ink-soft">
        One reading is a snapshot. Damp and mould depend on how conditions run over days and weeks, on the building and on its
        heating and ventilation. The calculations follow the ASHRAE Handbook formulas for moist air.
      </p>
    </section>
  );
}
