import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import type { StockImportPreviewResponse } from "@/lib/contracts/stock-imports";
import { usePreviewStockImport } from "../api/preview-stock-import";
import { useRunStockImport } from "../api/run-stock-import";

type Field = StockImportPreviewResponse["fields"][number];

/** What each field of a home is, for the mapping table. */
const FIELD_LABELS: Record<Field, string> = {
  uprn: "UPRN",
  address: "Whole address in one column",
  addressLine1: "Address, first line",
  addressLine2: "Address, second line",
  town: "Town",
  postcode: "Postcode",
  estate: "Estate",
  block: "Block",
  builtForm: "Built form",
  yearBuilt: "Year built or age band",
  wallConstruction: "Wall construction",
  wallInsulation: "Wall insulation",
  glazing: "Glazing",
  roofInsulation: "Roof or loft insulation",
  heating: "Heating",
  heatingFuel: "Heating fuel",
  extractFans: "Extract fans",
  trickleVents: "Trickle vents",
  ventilation: "Ventilation (PIV, MVHR…)",
  floorArea: "Floor area",
  epcBand: "EPC band",
  rooms: "Rooms",
};

/** Choose a register, check which column feeds which field, confirm, import; then the counts and the report. */
export function StockImportForm() {
  const [file, setFile] = useState<File | null>(null);
  const [mapping, setMapping] = useState<Partial<Record<Field, number>>>({});
  const [confirming, setConfirming] = useState(false);
  const preview = usePreviewStockImport();
  const run = useRunStockImport();
  const shown = preview.data;

  const choose = (f: File | null) => {
    setFile(f);
    setConfirming(false);
    preview.reset();
    run.reset();
    if (f) preview.mutate(f, { onSuccess: (p) => setMapping(p.mapping) });
  };

  const start = () => {
    if (!file || !shown) return;
    const full = Object.fromEntries(shown.fields.map((f) => [f, mapping[f] ?? null]));
    run.mutate({ file, mapping: full }, { onSettled: () => setConfirming(false) });
  };

  return (
    <div className="flex flex-col gap-4">
      <div>
        <label htmlFor="stock-file" className="block font-medium">
          Asset register (CSV or Excel .xlsx)
        </label>
        <p id="stock-file-hint" className="text-sm text-ink-soft">
          One row per home, with a header row. Homes are matched by their UPRN: importing the file again updates the homes that
          changed and never adds a home twice.
        </p>
        <input
          id="stock-file"
          type="file"
          accept=".csv,.txt,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
          aria-describedby="stock-file-hint"
          onChange={(e) => choose(e.target.files?.[0] ?? null)}
          className="mt-2"
        />
      </div>

      {preview.isPending && <p role="status">Reading the file…</p>}
      {preview.isError && (
        <Alert tone="danger" title="We could not read this file">
          {errorMessage(preview.error)}
        </Alert>
      )}

      {shown && (
        <section aria-labelledby="mapping-heading" className="flex flex-col gap-3">
          <h2 id="mapping-heading" className="text-lg font-semibold">
            Which column feeds which field
          </h2>
          <p className="text-sm text-ink-soft">
            We matched the columns by their names. Correct any that are wrong; a field set to “Not in this file” is left as it is
            on homes we already hold.
          </p>
          <div className="grid gap-2 sm:grid-cols-2">
            {shown.fields.map((field) => (
              <Select
                key={field}
                label={FIELD_LABELS[field]}
                value={mapping[field] === undefined ? "" : String(mapping[field])}
                onChange={(e) => {
                  const value = e.target.value;
                  setMapping((m) => {
                    const next = { ...m };
                    if (value === "") delete next[field];
                    else next[field] = Number(value);
                    return next;
                  });
                }}
              >
                <option value="">Not in this file</option>
                {shown.headers.map((h, i) => (
                  <option key={i} value={i}>
                    {h || `Column ${i + 1}`}
                  </option>
                ))}
              </Select>
            ))}
          </div>

          <div className="overflow-x-auto">
            <table className="min-w-full text-sm">
              <caption className="text-left font-medium">The first rows of the file, as written</caption>
              <thead>
                <tr>
                  {shown.headers.map((h, i) => (
                    <th key={i} scope="col" className="px-2 py-1 text-left">
                      {h}
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {shown.sampleRows.slice(0, 5).map((row, r) => (
                  <tr key={r}>
                    {shown.headers.map((_, i) => (
                      <td key={i} className="px-2 py-1">
                        {row[i] ?? ""}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>

          {mapping.uprn === undefined && (
            <Alert tone="warning" title="Choose the UPRN column">
              Homes are matched by their UPRN, so the import needs it.
            </Alert>
          )}

          {!confirming ? (
            <div>
              <Button onClick={() => setConfirming(true)} disabled={mapping.uprn === undefined}>
                Import these homes…
              </Button>
            </div>
          ) : (
            <div
              role="group"
              aria-labelledby="confirm-text"
              className="flex flex-col gap-2 rounded-md border border-line-strong p-3"
            >
              <p id="confirm-text">
                Import “{file?.name}”? New UPRNs become new homes and homes we hold are updated with what the file says. Nothing
                is stored unless the whole file goes in.
              </p>
              <div className="flex gap-2">
                <Button onClick={start} busy={run.isPending}>
                  Yes, import
                </Button>
                <Button variant="secondary" onClick={() => setConfirming(false)} disabled={run.isPending}>
                  Cancel
                </Button>
              </div>
            </div>
          )}
        </section>
      )}

      {run.isError && (
        <Alert tone="danger" title="Nothing was imported">
          {errorMessage(run.error)}
        </Alert>
      )}
      {run.data && (
        <Alert tone="success" title="Import finished" live="status">
          {run.data.created} new, {run.data.updated} updated, {run.data.unchanged} unchanged, {run.data.refused} refused.{" "}
          <a href={run.data.reportUrl} className="underline">
            Download every row’s outcome (CSV)
          </a>
        </Alert>
      )}
    </div>
  );
}
