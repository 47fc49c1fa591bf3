import { useMemo } from "react";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { LoadingState } from "@/components/ui/spinner";
import { isApiError } from "@/lib/api-client";
import { hotspotDimensionLabels, hotspotValueLabel, stageLabel, type DashboardResponse } from "@/lib/contracts/insight";
import { useDashboard } from "../api/get-dashboard";
import { useWhatWorks } from "../api/get-what-works";
import { useInsightFilters } from "../hooks/use-insight-filters";
import type { InsightFilters } from "../lib/insight-filters";
import { DashboardFilters } from "./dashboard-filters";
import { InsightChart } from "./insight-chart";
import { InsightTable } from "./insight-table";

const errorText = (e: unknown) => (isApiError(e) ? e.message : "The figures could not be loaded. Try again in a moment.");

/** The compliance dashboard: the period's deadlines, times, hotspots and workloads, then "what works". */
export function DashboardView() {
  const { filters, setFilters } = useInsightFilters();
  const dashboard = useDashboard(filters);
  const whatWorks = useWhatWorks(filters);
  const d = dashboard.data;

  return (
    <div className="flex flex-col gap-4">
      <DashboardFilters filters={filters} shown={d ?? null} estates={d?.estates ?? []} onChange={setFilters} />
      {dashboard.isError ? (
        <Alert tone="danger" title="Dashboard not loaded">
          {errorText(dashboard.error)}
        </Alert>
      ) : null}
      {dashboard.isPending ? <LoadingState>Working out the figures…</LoadingState> : null}
      {d ? <Figures d={d} filters={filters} /> : null}
      <Panel title="What works" id="what-works">
        {whatWorks.isPending ? <LoadingState>Loading the verdicts…</LoadingState> : null}
        {whatWorks.isError ? <Alert tone="danger">{errorText(whatWorks.error)}</Alert> : null}
        {whatWorks.data ? (
          <div className="flex flex-col gap-2">
            <p className="text-sm text-ink-soft">
              Closed cases whose fix was judged after the works, by the work done and the kind of home. Groups of fewer than{" "}
              {whatWorks.data.minGroupSize} fixes are not shown
              {whatWorks.data.groupsNotShown > 0 ? ` (${whatWorks.data.groupsNotShown} left out)` : ""}. The change in hours is
              after the works less before: below zero is fewer damp hours.
            </p>
            <InsightTable
              table="what-works"
              rows={whatWorks.data.groups}
              caption="Fixes judged effective"
              filters={filters}
              empty="No group has enough judged fixes in this period yet."
            />
          </div>
        ) : null}
      </Panel>
    </div>
  );
}

function Figures({ d, filters }: { d: DashboardResponse; filters: InsightFilters }) {
  const months = useMemo(() => d.seasonal.map((m) => m.month), [d.seasonal]);
  const seasonal = useMemo(() => [{ label: "Cases reported", values: d.seasonal.map((m) => m.cases) }], [d.seasonal]);
  const missedByMonth = useMemo(
    () =>
      d.stages.map((s) => ({
        label: stageLabel(s.stage),
        values: months.map((m) => d.stagesByMonth.find((r) => r.month === m && r.stage === s.stage)?.missed ?? 0),
      })),
    [d.stages, d.stagesByMonth, months],
  );
  const mostMissed = [...d.stages].sort((a, b) => b.missed - a.missed)[0];
  const topEstate = d.hotspots.find((h) => h.dimension === "estate" && h.cases > 0);

  return (
    <>
      <Panel title="At a glance" id="glance">
        <dl className="grid gap-3 sm:grid-cols-3">
          <div>
            <dt className="text-sm text-ink-soft">Open cases now</dt>
            <dd className="text-2xl font-bold">{d.open.total.toLocaleString("en-GB")}</dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Stage most often missed</dt>
            <dd className="text-lg font-bold">
              {mostMissed && mostMissed.missed > 0
                ? `${stageLabel(mostMissed.stage)} (${mostMissed.missed} missed)`
                : "None missed"}
            </dd>
          </div>
          <div>
            <dt className="text-sm text-ink-soft">Estate with most cases per 100 homes</dt>
            <dd className="text-lg font-bold">
              {topEstate ? `${hotspotValueLabel("estate", topEstate.value)} (${topEstate.perHundredHomes ?? "—"})` : "No cases"}
            </dd>
          </div>
        </dl>
        <p className="mt-2 text-sm text-ink-soft">
          Cases reported {d.from} to {d.to}
          {d.estate ? ` on ${d.estate}` : ""}; the open cases and workloads are as of now.
        </p>
      </Panel>

      <Panel title="Open cases" id="open">
        <div className="grid gap-4 lg:grid-cols-3">
          <InsightTable table="open-status" rows={d.open.byStatus} caption="By status" filters={filters} empty="No open cases." />
          <InsightTable table="open-risk" rows={d.open.byRisk} caption="By risk state" filters={filters} empty="No open cases." />
          <InsightTable
            table="open-category"
            rows={d.open.byCategory}
            caption="By HHSRS category"
            filters={filters}
            empty="No open cases."
          />
        </div>
      </Panel>

      <Panel title="Deadlines" id="deadlines">
        <InsightTable
          table="stages"
          rows={d.stages}
          caption="Deadline stages met, missed and open"
          filters={filters}
          empty="No deadlines in this period."
        />
        <h3 className="mt-4 font-semibold">Missed deadlines by month reported</h3>
        <InsightChart categories={months} series={missedByMonth} yLabel="Missed" />
        <details className="mt-2">
          <summary className="cursor-pointer font-semibold">Deadline stages by month (table)</summary>
          <InsightTable
            table="stages-by-month"
            rows={d.stagesByMonth}
            caption="Deadline stages by month reported"
            filters={filters}
            empty="No deadlines in this period."
          />
        </details>
      </Panel>

      <Panel title="How long it takes" id="durations">
        <InsightTable
          table="durations"
          rows={d.durations}
          caption="Working days from awareness"
          filters={filters}
          empty="Nothing done yet in this period."
        />
        <p className="mt-2 text-sm">
          Repeat cases (the same home reported within 12 months before): {d.repeats.repeats} of {d.repeats.cases}
          {d.repeats.pct === null ? "" : ` (${d.repeats.pct} %)`}.
        </p>
      </Panel>

      <Panel title="Seasonal trend" id="season">
        <InsightChart categories={months} series={seasonal} yLabel="Cases" />
        <details className="mt-2">
          <summary className="cursor-pointer font-semibold">Cases by month (table)</summary>
          <InsightTable
            table="seasonal"
            rows={d.seasonal}
            caption="Cases by month reported"
            filters={filters}
            empty="No cases in this period."
          />
        </details>
      </Panel>

      <Panel title="Hotspots" id="hotspots">
        <p className="mb-2 text-sm text-ink-soft">
          Cases per 100 homes, highest first within each grouping (
          {Object.values(hotspotDimensionLabels).join(", ").toLowerCase()}).
        </p>
        <InsightTable table="hotspots" rows={d.hotspots} caption="Cases per 100 homes" filters={filters} empty="No homes." />
      </Panel>

      <Panel title="Complaints" id="complaints">
        <p className="mb-2 text-sm text-ink-soft">
          Formal complaints raised in the period (the whole landlord, whatever the estate): {d.complaints.raised} raised,{" "}
          {d.complaints.open} open, {d.complaints.closed} closed, {d.complaints.escalated} taken to stage 2;{" "}
          {d.complaints.apologies} apologies; compensation offered {pounds(d.complaints.compensationOfferedPence)}, paid{" "}
          {pounds(d.complaints.compensationPaidPence)}.
        </p>
        <InsightTable
          table="complaints"
          rows={d.complaints.raised ? d.complaints.stages : []}
          caption="Complaint clocks by stage"
          filters={filters}
          empty="No formal complaint was raised in this period."
        />
      </Panel>

      <Panel title="Workload" id="workload">
        <div className="grid gap-4 lg:grid-cols-2">
          <InsightTable
            table="officers"
            rows={d.officers}
            caption="Open cases by officer"
            filters={filters}
            empty="No open cases are assigned."
          />
          <InsightTable
            table="operatives"
            rows={d.operatives}
            caption="Open work orders by operative"
            filters={filters}
            empty="No open work orders are assigned."
          />
        </div>
      </Panel>
    </>
  );
}

const pounds = (pence: number) =>
  `£${(pence / 100).toLocaleString("en-GB", { minimumFractionDigits: 2, maximumFractionDigits: 2 })}`;
