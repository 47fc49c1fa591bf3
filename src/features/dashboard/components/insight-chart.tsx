import { useEffect, useRef, useState } from "react";
import uPlot from "uplot";
import "uplot/dist/uPlot.min.css";

const HEIGHT = 240;
// Our palette (src/styles/index.css); the lines also differ in dash, not only colour.
const COLOURS = ["#12444f", "#a3312a", "#7a4a07", "#2c6a35", "#5b3f8c"];
const DASHES: (number[] | undefined)[] = [undefined, [8, 4], [2, 3], [10, 3, 2, 3], [4, 4]];
const AXIS = "#4a5a66";
const GRID = "#d5dbdf";

export interface ChartSeries {
  label: string;
  values: number[];
}

function canDraw(): boolean {
  try {
    return typeof window !== "undefined" && document.createElement("canvas").getContext("2d") !== null;
  } catch {
    return false;
  }
}

/**
 * A small uPlot chart over categories (months): bars for one series, lines for several. The chart is
 * a picture for sighted readers (aria-hidden); the table beside it holds the same figures.
 */
export function InsightChart({ categories, series, yLabel }: { categories: string[]; series: ChartSeries[]; yLabel: string }) {
  const ref = useRef<HTMLDivElement>(null);
  const [drawable] = useState(canDraw);

  useEffect(() => {
    const el = ref.current;
    if (!el || !drawable || categories.length === 0) return;
    const bars = series.length === 1;
    const x = categories.map((_, i) => i);
    const opts: uPlot.Options = {
      width: Math.max(280, el.clientWidth),
      height: HEIGHT,
      legend: { show: !bars },
      series: [
        { label: "Month", value: (_u, v) => (v == null ? "–" : (categories[v] ?? "")) },
        ...series.map((s, i) => ({
          label: s.label,
          stroke: COLOURS[i % COLOURS.length],
          fill: bars ? `${COLOURS[0]}cc` : undefined,
          width: bars ? 1 : 2,
          dash: bars ? undefined : DASHES[i % DASHES.length],
          paths: bars ? uPlot.paths.bars!({ size: [0.6, 60] }) : undefined,
          points: { show: !bars },
        })),
      ],
      scales: {
        x: { time: false, range: [-0.5, categories.length - 0.5] },
        y: { range: (_u, _min, max) => [0, Math.max(1, max)] },
      },
      axes: [
        {
          stroke: AXIS,
          grid: { show: false },
          splits: () => x,
          values: (_u, splits) => splits.map((v) => categories[v] ?? ""),
        },
        { label: yLabel, stroke: AXIS, grid: { stroke: GRID } },
      ],
      cursor: { drag: { x: false, y: false } },
    };
    let plot: uPlot;
    try {
      plot = new uPlot(opts, [x, ...series.map((s) => s.values)] as uPlot.AlignedData, el);
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
  }, [categories, series, yLabel, drawable]);

  if (!drawable) return <p className="text-ink-soft">This browser can't draw the chart; the table has the same figures.</p>;
  return (
    <div aria-hidden="true" className="rounded-md border border-line bg-surface p-2">
      <div ref={ref} className="w-full overflow-hidden" />
    </div>
  );
}
