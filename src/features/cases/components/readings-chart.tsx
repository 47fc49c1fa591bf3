import { useEffect, useMemo, useRef, useState } from "react";
import uPlot from "uplot";
import { LONDON } from "@/lib/dates";
import "uplot/dist/uPlot.min.css";
import { MOULD_SURFACE_RH_PCT } from "@/lib/domain";
import type { CaseReading } from "../api/types";
import { chartSeries } from "../lib/derived";

const HEIGHT = 300;

// Our palette (src/styles/index.css); each line also differs in width or dash, not only colour.
const COLOURS = {
  air: "#7a4a07",
  dewPoint: "#2f8aa3",
  rh: "#12444f",
  surfaceRh: "#2c6a35",
  limit: "#a3312a",
  grid: "#d5dbdf",
  axis: "#4a5a66",
};

function canDraw(): boolean {
  try {
    return typeof window !== "undefined" && document.createElement("canvas").getContext("2d") !== null;
  } catch {
    return false;
  }
}

interface ReadingsChartProps {
  readings: readonly CaseReading[];
  /** Names the chart for screen readers and in the caption. */
  title: string;
}

/**
 * Air temperature, dew point, relative humidity and surface humidity over time, with the 80 %
 * mould-growth level dashed. uPlot draws to a canvas, so 50 000 points stay fast; the table
 * beside it carries the same readings for anyone who cannot see the chart.
 */
export function ReadingsChart({ readings, title }: ReadingsChartProps) {
  const ref = useRef<HTMLDivElement>(null);
  const [drawable] = useState(canDraw);
  const data = useMemo(() => chartSeries(readings), [readings]);

  useEffect(() => {
    const el = ref.current;
    if (!el || !drawable || data.t.length === 0) return;
    const limit = new Array<number>(data.t.length).fill(MOULD_SURFACE_RH_PCT);
    const series: uPlot.Series[] = [
      {},
      {
        label: "Air temperature (°C)",
        scale: "C",
        stroke: COLOURS.air,
        width: 2,
        value: (_u, v) => (v == null ? "–" : `${v.toFixed(1)} °C`),
      },
      {
        label: "Dew point (°C)",
        scale: "C",
        stroke: COLOURS.dewPoint,
        width: 1.5,
        dash: [2, 3],
        value: (_u, v) => (v == null ? "–" : `${v.toFixed(1)} °C`),
      },
      {
        label: "Relative humidity (%)",
        scale: "%",
        stroke: COLOURS.rh,
        width: 1.5,
        value: (_u, v) => (v == null ? "–" : `${v.toFixed(0)} %`),
      },
    ];
    const values: uPlot.AlignedData[number][] = [data.t, data.air, data.dewPoint, data.rh];
    if (data.hasSurface) {
      series.push({
        label: "Surface humidity (%)",
        scale: "%",
        stroke: COLOURS.surfaceRh,
        width: 2.5,
        value: (_u, v) => (v == null ? "–" : `${v.toFixed(0)} %`),
      });
      values.push(data.surfaceRh);
    }
    series.push({
      label: `Mould-growth level (${MOULD_SURFACE_RH_PCT} %)`,
      scale: "%",
      stroke: COLOURS.limit,
      width: 1.5,
      dash: [8, 6],
      points: { show: false },
    });
    values.push(limit);

    const opts: uPlot.Options = {
      width: Math.max(280, el.clientWidth),
      height: HEIGHT,
      series,
      // The time axis in London time, as every date on screen (uPlot would use the browser's zone).
      tzDate: (ts) => uPlot.tzDate(new Date(ts * 1000), LONDON),
      scales: { x: { time: true }, "%": { range: [0, 100] } },
      axes: [
        { stroke: COLOURS.axis, grid: { stroke: COLOURS.grid } },
        { scale: "C", label: "°C", stroke: COLOURS.axis, grid: { stroke: COLOURS.grid } },
        { scale: "%", label: "%", side: 1, stroke: COLOURS.axis, grid: { show: false } },
      ],
      cursor: { drag: { x: true, y: false } },
    };
    let plot: uPlot;
    try {
      plot = new uPlot(opts, values as uPlot.AlignedData, el);
    } catch {
      return;
    }
    const resize = () => plot.setSize({ width: Math.max(280, el.clientWidth), height: HEIGHT });
    const observer = typeof ResizeObserver === "function" ? new ResizeObserver(resize) : null;
    observer?.observe(el);
    return () => {
      observer?.disconnect();
      plot.destroy();
    };
  }, [data, drawable]);

  if (data.t.length === 0) return null;
  return (
    <figure className="flex flex-col gap-2">
      <figcaption className="text-sm text-ink-soft">
        {title}: {data.t.length.toLocaleString("en-GB")} {data.t.length === 1 ? "reading" : "readings"}. Drag across the chart to
        zoom in, double-click to zoom out. The table below lists the same readings.
      </figcaption>
      {drawable ? (
        <div aria-hidden="true" className="rounded-md border border-line bg-surface p-2">
          <div ref={ref} className="w-full overflow-hidden" />
        </div>
      ) : (
        <p className="rounded-md border border-dashed border-line-strong px-3 py-4 text-ink-soft">
          This browser can't draw the chart; the table below has the same readings.
        </p>
      )}
    </figure>
  );
}
