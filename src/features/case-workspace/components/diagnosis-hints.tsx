import { EmptyState } from "@/components/ui/empty-state";
import { DIAGNOSIS_HINTS } from "../lib/labels";

export interface DiagnosisRoom {
  roomId: number;
  roomName: string;
  series: { diagnosis?: { kind: string; reasons: readonly string[] } | null } | null;
}

/** The engine's diagnosis for each room with readings: a hint for the inspection, not a finding. */
export function DiagnosisHints({ rooms }: { rooms: readonly DiagnosisRoom[] }) {
  const withDiagnosis = rooms.filter((r) => r.series?.diagnosis);
  if (withDiagnosis.length === 0)
    return <EmptyState title="No diagnosis yet">The engine needs readings over time to suggest a cause.</EmptyState>;
  return (
    <div className="flex flex-col gap-3">
      <p className="text-sm text-ink-soft">
        Hints from the readings to check on site. They never decide whether the report is investigated.
      </p>
      <ul className="flex flex-col gap-3">
        {withDiagnosis.map((r) => {
          const d = r.series!.diagnosis!;
          return (
            <li key={r.roomId} className="rounded-md border border-line bg-paper p-3">
              <p className="font-semibold">
                {r.roomName}: {DIAGNOSIS_HINTS[d.kind] ?? d.kind}
              </p>
              {d.reasons.length ? (
                <ul className="mt-1 list-disc space-y-1 pl-5 text-sm">
                  {d.reasons.map((reason) => (
                    <li key={reason}>{reason}</li>
                  ))}
                </ul>
              ) : null}
            </li>
          );
        })}
      </ul>
    </div>
  );
}
