import { useEffect, useMemo, useRef, useState } from "react";
import uPlot from "uplot";
import { formatChartTime, LONDON } from "@/lib/dates";
import "uplot/dist/uPlot.min.css";
import { MOULD_SURFACE_RH_PCT } from "@/lib/domain";
import type { CaseReading } from "../api/types";
import { chartSeries, GAP_FACTOR } from "../lib/derived";

/** Taller than wide screens need: on a phone the chart is narrow and the legend sits under it. */
const heightFor = (width: number) => (width < 560 ? 320 : 340);
const LIMIT_LABEL = `${MOULD_SURFACE_RH_PCT} % surface humidity: mould can grow`;

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
      { label: "Time", value: (_u, v) => (v == null ? "–" : formatChartTime(v)) },
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
      label: LIMIT_LABEL,
      scale: "%",
      stroke: COLOURS.limit,
      width: 1.5,
      dash: [8, 6],
      points: { show: false },
      value: () => `${MOULD_SURFACE_RH_PCT} %`,
    });
    values.push(limit);
    const limitIndex = series.length - 1;

    const width = Math.max(280, el.clientWidth);
    const wide = width >= 560;
    const opts: uPlot.Options = {
      width,
      height: heightFor(width),
      series,
      // The time axis in London time, as every date on screen (uPlot would use the browser's zone).
      tzDate: (ts) => uPlot.tzDate(new Date(ts * 1000), LONDON),
      scales: { x: { time: true }, "%": { range: [0, 100] } },
      axes: [
        {
          stroke: COLOURS.axis,
          grid: { stroke: COLOURS.grid },
          // "26 Nov" over "14:00", London time: readable at a glance, never "11/26".
          values: (_u, splits) => splits.map((t) => formatChartTime(t, "\n")),
          size: 52,
          space: 70,
        },
        // On a phone the axes are narrow and unlabelled (the legend names each line with its unit), so the plot keeps its width.
        {
          scale: "C",
          label: wide ? "°C" : undefined,
          size: wide ? 50 : 40,
          stroke: COLOURS.axis,
          grid: { stroke: COLOURS.grid },
        },
        {
          scale: "%",
          label: wide ? "%" : undefined,
          size: wide ? 50 : 40,
          side: 1,
          stroke: COLOURS.axis,
          grid: { show: false },
        },
      ],
      cursor: { drag: { x: true, y: false } },
      hooks: {
        // The dashed line carries its own words, at its right-hand end, above the line.
        draw: [
          (u) => {
            if (!u.series[limitIndex]?.show) return;
            const y = u.valToPos(MOULD_SURFACE_RH_PCT, "%", true);
            const ctx = u.ctx;
            const pr = uPlot.pxRatio;
            ctx.save();
            ctx.font = `${Math.round(12 * pr)}px system-ui, sans-serif`;
            ctx.fillStyle = COLOURS.limit;
            ctx.textAlign = "right";
            ctx.textBaseline = "bottom";
            // The whole label where it fits, else just the level.
            const text = ctx.measureText(LIMIT_LABEL).width < u.bbox.width - 8 * pr ? LIMIT_LABEL : `${MOULD_SURFACE_RH_PCT} %`;
            ctx.fillText(text, u.bbox.left + u.bbox.width - 4 * pr, y - 3 * pr);
            ctx.restore();
          },
        ],
      },
    };
    let plot: uPlot;
    try {
      plot = new uPlot(opts, values as uPlot.AlignedData, el);
    } catch {
      return;
    }
    const resize = () => {
      const w = Math.max(280, el.clientWidth);
      plot.setSize({ width: w, height: heightFor(w) });
    };
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
        {title}: {readings.length.toLocaleString("en-GB")} {readings.length === 1 ? "reading" : "readings"}, London time. A break
        in a line means no readings for more than {GAP_FACTOR} times the usual interval. Drag across the chart to zoom in,
        double-click to zoom out. The table below lists the same readings.
      </figcaption>
      {drawable ? (
        <div aria-hidden="true" className="rounded-md border border-line bg-surface p-1 sm:p-2">
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
