import { useEffect, useMemo, useRef, useState } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";
import type { SensorReadingsResponse } from "@/lib/contracts";
import { formatChartTime, LONDON } from "@/lib/dates";

// Our palette (src/styles/index.css); each line also differs in width or dash, not only colour.
const COLOURS = { air: "#7a4a07", surface: "#2c6a35", rh: "#12444f", grid: "#d5dbdf", axis: "#4a5a66" };

function canDraw(): boolean {
  try {
    return typeof window !== "undefined" && document.createElement("canvas").getContext("2d") !== null;
  } catch {
    return false;
  }
}

/** Air and surface temperature and relative humidity of one sensor; redrawn as new readings arrive. */
export function SensorReadingsChart({ series }: { series: SensorReadingsResponse }) {
  const ref = useRef<HTMLDivElement>(null);
  const [drawable] = useState(canDraw);
  const data = useMemo(() => {
    const t = series.points.map((p) => Date.parse(p.takenAt) / 1000);
    const air = series.points.map((p) => p.airTemperatureC);
    const rh = series.points.map((p) => p.relativeHumidityPct);
    const surface = series.points.map((p) => p.surfaceTemperatureC);
    return { t, air, rh, surface, hasSurface: surface.some((v) => v !== null) };
  }, [series]);

  useEffect(() => {
    const el = ref.current;
    if (!el || !drawable || data.t.length === 0) return;
    const lines: uPlot.Series[] = [
      { label: "Time", value: (_u, v) => (v == null ? "–" : formatChartTime(v)) },
      {
        label: "Air (°C)",
        scale: "C",
        stroke: COLOURS.air,
        width: 2,
        value: (_u, v) => (v == null ? "–" : `${v.toFixed(1)} °C`),
      },
      {
        label: "RH (%)",
        scale: "%",
        stroke: COLOURS.rh,
        width: 1.5,
        dash: [4, 3],
        value: (_u, v) => (v == null ? "–" : `${v.toFixed(0)} %`),
      },
    ];
    const values: (number | null)[][] = [data.t, data.air, data.rh];
    if (data.hasSurface) {
      lines.push({
        label: "Surface (°C)",
        scale: "C",
        stroke: COLOURS.surface,
        width: 2.5,
        value: (_u, v) => (v == null ? "–" : `${v.toFixed(1)} °C`),
      });
      values.push(data.surface);
    }
    const width = Math.max(280, el.clientWidth);
    let plot: uPlot;
    try {
      plot = new uPlot(
        {
          width,
          height: 300,
          series: lines,
          tzDate: (ts) => uPlot.tzDate(new Date(ts * 1000), LONDON),
          scales: { x: { time: true }, "%": { range: [0, 100] } },
          axes: [
            {
              stroke: COLOURS.axis,
              grid: { stroke: COLOURS.grid },
              values: (_u, s) => s.map((t) => formatChartTime(t, "\n")),
              size: 52,
            },
            { scale: "C", label: "°C", stroke: COLOURS.axis, grid: { stroke: COLOURS.grid } },
            { scale: "%", label: "%", side: 1, stroke: COLOURS.axis, grid: { show: false } },
          ],
        },
        values as uPlot.AlignedData,
        el,
      );
    } catch {
      return;
    }
    const observer =
      typeof ResizeObserver === "function"
        ? new ResizeObserver(() => plot.setSize({ width: Math.max(280, el.clientWidth), height: 300 }))
        : null;
    observer?.observe(el);
    return () => {
      observer?.disconnect();
      plot.destroy();
    };
  }, [data, drawable]);

  if (data.t.length === 0) return <p className="text-ink-soft">No readings in this window yet.</p>;
  return (
    <figure className="flex flex-col gap-2">
      <figcaption className="text-sm text-ink-soft">
        {series.points.length.toLocaleString("en-GB")}{" "}
        {series.bucketS > 0 ? `averages of ${Math.round(series.bucketS / 60)} minutes` : "readings"}, London time; refreshed every
        15 seconds.
      </figcaption>
      {drawable ? (
        <div aria-hidden="true" className="rounded-md border border-line bg-surface p-1 sm:p-2">
          <div ref={ref} className="w-full overflow-hidden" />
        </div>
      ) : null}
    </figure>
  );
}
