import { useId } from "react";
import { ReportStillMatters, SafetyCautions } from "@/components/risk/cautions";
import { RiskPanel } from "@/components/risk/risk-panel";
import { formatDateTime } from "@/lib/dates";
import { fixed } from "@/lib/domain/wording";
import type { CaseEvaluation, RoomEvaluation } from "../api/types";
import { diagnosisLabels, humanise } from "../labels";

interface CaseEvaluationViewProps {
  evaluation: CaseEvaluation;
  /** Shown when there are no readings: how to add some (the page knows where the button is). */
  emptyHint?: string;
  /** Staff views leave out the prompt addressed to the tenant ("tell your landlord"). */
  audience?: "tenant" | "staff";
}

const hoursText = (h: number) => `${fixed(h, h < 10 ? 1 : 0)} ${h === 1 ? "hour" : "hours"}`;

/**
 * The risk engine's answer for each room with readings: every surface the report points at, and
 * what the readings over time suggest. Always with the cautions, and always with the promise that
 * the report is looked into whatever the numbers say.
 */
export function CaseEvaluationView({ evaluation, emptyHint, audience = "tenant" }: CaseEvaluationViewProps) {
  return (
    <div className="flex flex-col gap-5">
      {audience === "tenant" ? <ReportStillMatters /> : null}
      {audience === "tenant" && evaluation.statement ? <p className="font-semibold">{evaluation.statement}</p> : null}
      {evaluation.updating ? (
        <p role="status" className="text-sm text-ink-soft">
          Being updated with the newest readings.
        </p>
      ) : null}
      {evaluation.rooms.length === 0 ? (
        <p className="text-ink-soft">No readings yet. Readings are optional{emptyHint ? `: ${emptyHint}` : "."}</p>
      ) : (
        evaluation.rooms.map((room) => <RoomResult key={room.roomId} room={room} audience={audience} />)
      )}
      {audience === "tenant" ? (
        <SafetyCautions headingLevel={3} />
      ) : (
        <p className="text-sm text-ink-soft">
          The tenant sees these results on their case page with the safety cautions about cleaning mould, heating and ventilation.
        </p>
      )}
    </div>
  );
}

function RoomResult({ room, audience }: { room: RoomEvaluation; audience: "tenant" | "staff" }) {
  const id = useId();
  const latest = room.latest;
  const series = room.series;
  const diagnosis = series?.diagnosis;
  const baseKind = diagnosis ? (diagnosisLabels[diagnosis.kind] ?? { title: humanise(diagnosis.kind) }) : null;
  // The latest reading is one moment and the diagnosis judges the time between readings (for the
  // report's main surface): when they disagree, say both plainly rather than contradict the badge above.
  const latestRisky = room.surfaces.some(
    (s) => s.result.surface.state === "condensing" || s.result.surface.state === "mould-risk",
  );
  const kind =
    diagnosis?.kind === "no-risk-found" && latestRisky && baseKind
      ? {
          title: `Over time, these readings didn't show lasting condensation or mould-growth conditions${
            room.surfaces[0] ? ` on the ${room.surfaces[0].label.toLowerCase()}` : ""
          }`,
          note: "The latest reading, shown above, is one moment and does point to a risk; more readings over time will show whether it lasts.",
        }
      : baseKind;

  return (
    <section aria-labelledby={`${id}-room`} className="flex flex-col gap-4 rounded-lg border border-line bg-paper p-4">
      <h3 id={`${id}-room`} className="text-lg font-bold">
        {room.roomName}
      </h3>
      {latest ? (
        <p>
          Latest of {room.readingsCount.toLocaleString("en-GB")} {room.readingsCount === 1 ? "reading" : "readings"}, taken{" "}
          <time dateTime={latest.takenAt}>{formatDateTime(latest.takenAt)}</time>: air {fixed(latest.airTemperatureC, 1)} °C at{" "}
          {fixed(latest.relativeHumidityPct, 0)} % relative humidity
          {latest.surfaceTemperatureC !== null ? `, surface ${fixed(latest.surfaceTemperatureC, 1)} °C` : ""}
          {latest.outdoorTemperatureC !== null ? `, outdoors ${fixed(latest.outdoorTemperatureC, 1)} °C` : ""}.
        </p>
      ) : null}

      {room.surfaces.map((surface) => (
        <div key={surface.element} className="flex flex-col gap-2">
          <h4 className="font-bold">{surface.label}</h4>
          <RiskPanel result={surface.result} />
        </div>
      ))}

      {diagnosis && kind ? (
        <div className="flex flex-col gap-2">
          <h4 className="font-bold">What the readings over time point to</h4>
          <p className="font-semibold">{kind.title}</p>
          {series && series.count > 1 ? (
            <p className="text-sm text-ink-soft">
              From {series.from ? formatDateTime(series.from) : "the first reading"} to{" "}
              {series.to ? formatDateTime(series.to) : "the last"}: the surface was at 80 % relative humidity or more for{" "}
              {hoursText(series.hoursSurfaceRhAtLeast80)}, and wet with condensation for {hoursText(series.hoursCondensing)}.
            </p>
          ) : null}
          <ul className="list-disc space-y-1 pl-5">
            {diagnosis.reasons.map((reason) => (
              <li key={reason}>{reason}</li>
            ))}
          </ul>
          {audience === "staff" && kind.staffNote ? <p>{kind.staffNote}</p> : kind.note ? <p>{kind.note}</p> : null}
        </div>
      ) : null}
    </section>
  );
}
