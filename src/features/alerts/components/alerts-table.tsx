import { useState } from "react";
import { Link, useNavigate, useSearchParams } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Input } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { errorMessage } from "@/lib/api-client";
import type { AlertSortKey, HomeAtRiskResponse } from "@/lib/contracts";
import { formatDateTimeZoned, formatDay } from "@/lib/dates";
import { alertListState, useAlerts } from "../api/get-alerts";
import { useDismissAlert } from "../api/dismiss-alert";
import { useOpenProactiveCase } from "../api/open-proactive-case";

const RULE_WORDS: Record<string, string> = {
  "mould-index": "Mould growth index",
  "hours-at-80": "Damp surface for long hours",
  "condensing-days": "Condensation on several days",
};

const BASIS_WORDS: Record<string, string> = {
  measured: "surface measured",
  estimated: "surface estimated from the outdoor temperature",
  air: "no surface figure: air humidity only",
};

const SORTS: { key: AlertSortKey; label: string }[] = [
  { key: "address", label: "Home" },
  { key: "mouldIndex", label: "Mould index" },
  { key: "hoursAt80", label: "Hours ≥ 80 %" },
  { key: "raisedAt", label: "First alert" },
];

const worst = (h: HomeAtRiskResponse) => ({
  mouldIndex: Math.max(0, ...h.rooms.map((r) => r.mouldIndex)),
  hoursAt80: Math.max(0, ...h.rooms.map((r) => r.hoursAt80)),
  condensingDays: Math.max(0, ...h.rooms.map((r) => r.condensingDays)),
});

/** Seven small bars, one per day, of the hours a room's surface was at 80 % RH or more (24 h = full height). */
function DayBars({ days, label }: { days: { date: string; hoursAt80: number }[]; label: string }) {
  return (
    <svg width={7 * 8} height={24} role="img" aria-label={label} className="inline-block align-middle">
      {days.map((d, i) => {
        const h = Math.max(1, Math.round((Math.min(24, d.hoursAt80) / 24) * 24));
        return <rect key={d.date} x={i * 8} y={24 - h} width={6} height={h} className="fill-dew-700" />;
      })}
    </svg>
  );
}

/** The Alerts view: homes whose sensors show risk and that have no open case, with one action to open one. */
export function AlertsTable() {
  const [search, setSearch] = useSearchParams();
  const state = alertListState(search);
  const alerts = useAlerts(state);

  const sortBy = (key: AlertSortKey) => {
    const next = new URLSearchParams(search);
    const dir = state.sort === key && state.dir === "desc" ? "asc" : "desc";
    next.set("sort", key);
    next.set("dir", dir);
    setSearch(next, { replace: true });
  };

  if (alerts.isPending) return <LoadingState>Loading the homes at risk…</LoadingState>;
  if (alerts.isError) {
    return (
      <Alert tone="danger" title="We could not load the alerts">
        <p>{errorMessage(alerts.error)}</p>
      </Alert>
    );
  }
  if (alerts.data.items.length === 0) {
    return (
      <EmptyState title="No homes at risk without a case">
        When a home's sensors show conditions in which mould can start, it is listed here until a case is opened or the alert is
        dismissed. Alerts on homes with an open case are shown on that case.
      </EmptyState>
    );
  }
  return (
    <table className="w-full text-left text-sm">
      <thead>
        <tr>
          {SORTS.map((s) => (
            <th
              key={s.key}
              scope="col"
              aria-sort={state.sort === s.key ? (state.dir === "asc" ? "ascending" : "descending") : "none"}
              className="py-2 pr-3"
            >
              <button type="button" className="font-semibold underline-offset-2 hover:underline" onClick={() => sortBy(s.key)}>
                {s.label}
              </button>
            </th>
          ))}
          <th scope="col" className="py-2 pr-3">
            Rooms and the last 7 days
          </th>
          <th scope="col" className="py-2">
            <span className="sr-only">Actions</span>
          </th>
        </tr>
      </thead>
      <tbody>
        {alerts.data.items.map((home) => (
          <HomeRow key={home.propertyId} home={home} />
        ))}
      </tbody>
    </table>
  );
}

function HomeRow({ home }: { home: HomeAtRiskResponse }) {
  const navigate = useNavigate();
  const open = useOpenProactiveCase();
  const dismiss = useDismissAlert();
  const [dismissing, setDismissing] = useState(false);
  const [reason, setReason] = useState("");
  const w = worst(home);
  const rules = [...new Set(home.alerts.map((a) => a.rule))];

  return (
    <tr className="border-t border-line align-top">
      <th scope="row" className="py-3 pr-3 font-normal">
        <Link to={`/homes/${home.propertyId}`} className="font-semibold underline">
          {home.address}
        </Link>
        <div className="text-ink-soft">{home.estate}</div>
        <ul className="mt-1">
          {rules.map((r) => (
            <li key={r}>{RULE_WORDS[r] ?? r}</li>
          ))}
        </ul>
      </th>
      <td className="py-3 pr-3">{w.mouldIndex.toFixed(1)}</td>
      <td className="py-3 pr-3">
        {Math.round(w.hoursAt80)} h{w.condensingDays > 0 ? `, condensing on ${w.condensingDays} of 7 days` : ""}
      </td>
      <td className="py-3 pr-3">{formatDateTimeZoned(home.firstRaisedAt)}</td>
      <td className="py-3 pr-3">
        <ul className="flex flex-col gap-1">
          {home.rooms.map((r) => (
            <li key={r.roomId}>
              <span className="font-semibold">{r.roomName}</span>{" "}
              <DayBars
                days={r.days}
                label={`${r.roomName}: hours at 80 % surface humidity or more per day, ${r.days
                  .map((d) => `${formatDay(d.date)} ${Math.round(d.hoursAt80)} h`)
                  .join(", ")}`}
              />{" "}
              <span className="text-ink-soft">({BASIS_WORDS[r.surfaceBasis]})</span>
            </li>
          ))}
        </ul>
        <Link to={`/homes/${home.propertyId}#readings`} className="underline">
          Readings chart
        </Link>
      </td>
      <td className="py-3">
        <div className="flex flex-col gap-2">
          <Button
            size="sm"
            busy={open.isPending}
            onClick={() => open.mutate(home.alertId, { onSuccess: (r) => void navigate(`/cases/${r.caseId}`) })}
          >
            Open a case
          </Button>
          {open.isError ? <Alert tone="danger">{errorMessage(open.error)}</Alert> : null}
          {dismissing ? (
            <form
              className="flex flex-col gap-2"
              onSubmit={(e) => {
                e.preventDefault();
                dismiss.mutate({ alertId: home.alertId, reason });
              }}
            >
              <Input label="Why dismiss it?" value={reason} onChange={(e) => setReason(e.target.value)} />
              {dismiss.isError ? <Alert tone="danger">{errorMessage(dismiss.error)}</Alert> : null}
              <Button size="sm" variant="secondary" type="submit" busy={dismiss.isPending}>
                Dismiss
              </Button>
            </form>
          ) : (
            <Button size="sm" variant="ghost" onClick={() => setDismissing(true)}>
              Dismiss…
            </Button>
          )}
        </div>
      </td>
    </tr>
  );
}
