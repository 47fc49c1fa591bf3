import { useEffect, useMemo, useRef, useState } from "react";
import uPlot from "uplot";
import { LONDON } from "@/lib/dates";
import "uplot/dist/uPlot.min.css";
import { MOULD_SURFACE_RH_PCT } from "@/lib/domain";
import type { BeforeAfter } from "../api/case-types";
import { chartSummary, verificationSeries } from "../lib/verification-view";

const HEIGHT = 260;

// Our palette (src/styles/index.css); the two periods also differ in dash, not only colour.
const COLOURS = { before: "#7a4a07", after: "#2c6a35", limit: "#a3312a", works: "#12444f", grid: "#d5dbdf", axis: "#4a5a66" };

function canDraw(): boolean {
  try {
    return typeof window !== "undefined" && document.createElement("canvas").getContext("2d") !== null;
  } catch {
    return false;
  }
}

/** Surface humidity before and after the works, with the works marked by a vertical line and the 80 % level dashed. */
export function VerificationChart({ roomName, comparison }: { roomName: string; comparison: BeforeAfter }) {
  const ref = useRef<HTMLDivElement>(null);
  const [drawable] = useState(canDraw);
  const data = useMemo(() => verificationSeries(comparison), [comparison]);

  useEffect(() => {
    const el = ref.current;
    if (!el || !drawable || data.t.length === 0) return;
    const limit = new Array<number>(data.t.length).fill(MOULD_SURFACE_RH_PCT);
    const fmt = (_u: uPlot, v: number | null) => (v == null ? "–" : `${v.toFixed(0)} %`);
    const opts: uPlot.Options = {
      width: Math.max(280, el.clientWidth),
      height: HEIGHT,
      series: [
        {},
        { label: "Before the works", scale: "%", stroke: COLOURS.before, width: 1.5, dash: [4, 3], value: fmt },
        { label: "After the works", scale: "%", stroke: COLOURS.after, width: 2.5, value: fmt },
        {
          label: `Mould-growth level (${MOULD_SURFACE_RH_PCT} %)`,
          scale: "%",
          stroke: COLOURS.limit,
          width: 1.5,
          dash: [8, 6],
          points: { show: false },
        },
      ],
      // The time axis in London time, as every date on screen (uPlot would use the browser's zone).
      tzDate: (ts) => uPlot.tzDate(new Date(ts * 1000), LONDON),
      scales: { x: { time: true }, "%": { range: [0, 100] } },
      axes: [
        { stroke: COLOURS.axis, grid: { stroke: COLOURS.grid } },
        { scale: "%", label: "Surface humidity (%)", stroke: COLOURS.axis, grid: { stroke: COLOURS.grid } },
      ],
      hooks: {
        draw: [
          (u) => {
            // The works: a vertical line at the moment they were completed.
            const x = u.valToPos(data.worksAt, "x", true);
            if (!Number.isFinite(x) || x < u.bbox.left || x > u.bbox.left + u.bbox.width) return;
            const ctx = u.ctx;
            ctx.save();
            ctx.strokeStyle = COLOURS.works;
            ctx.lineWidth = 2 * devicePixelRatio;
            ctx.beginPath();
            ctx.moveTo(x, u.bbox.top);
            ctx.lineTo(x, u.bbox.top + u.bbox.height);
            ctx.stroke();
            ctx.fillStyle = COLOURS.works;
            ctx.font = `${12 * devicePixelRatio}px sans-serif`;
            ctx.fillText("Works done", x + 4 * devicePixelRatio, u.bbox.top + 14 * devicePixelRatio);
            ctx.restore();
          },
        ],
      },
      cursor: { drag: { x: true, y: false } },
    };
    let plot: uPlot;
    try {
      plot = new uPlot(opts, [data.t, data.before, data.after, limit] as uPlot.AlignedData, el);
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

  if (data.t.length === 0)
    return (
      <p className="text-ink-soft">No readings with a surface temperature in {roomName} yet, so there is nothing to chart.</p>
    );
  return (
    <figure className="flex flex-col gap-2">
      <figcaption className="text-sm text-ink-soft">
        {chartSummary(roomName, comparison)} The table above has the same figures.
      </figcaption>
      {drawable ? (
        <div aria-hidden="true" className="rounded-md border border-line bg-surface p-2">
          <div ref={ref} className="w-full overflow-hidden" />
        </div>
      ) : (
        <p className="rounded-md border border-dashed border-line-strong px-3 py-4 text-ink-soft">
          This browser can't draw the chart; the table above has the same figures.
        </p>
      )}
    </figure>
  );
}
