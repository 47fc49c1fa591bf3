import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { errorMessage } from "@/lib/api-client";
import { TENANCY_IMPORT_MAX_MB, TENANCY_IMPORT_MAX_ROWS, type TenancyMapping } from "@/lib/contracts";
import { useImportTenancies } from "../api/import-tenancies";
import { usePreviewTenancyImport } from "../api/preview-tenancy-import";
import { ColumnMapping } from "./column-mapping";
import { ImportResult } from "./import-result";

/** Choose a file, check the columns the server proposes, then import (after a confirmation). */
export function TenancyImportForm() {
  const [file, setFile] = useState<File | null>(null);
  const [mapping, setMapping] = useState<TenancyMapping | null>(null);
  const [confirming, setConfirming] = useState(false);
  const preview = usePreviewTenancyImport();
  const importing = useImportTenancies();

  const choose = (chosen: File | null) => {
    setFile(chosen);
    setMapping(null);
    importing.reset();
    if (chosen) preview.mutate(chosen, { onSuccess: (p) => setMapping(p.mapping) });
    else preview.reset();
  };

  const run = () => {
    if (!file || !mapping) return;
    importing.mutate({ file, mapping }, { onSettled: () => setConfirming(false) });
  };

  return (
    <div className="space-y-4">
      <div>
        <label htmlFor="tenancy-file" className="mb-1 block font-semibold text-ink">
          Tenancy file (CSV or .xlsx)
        </label>
        <p id="tenancy-file-hint" className="mb-2 text-sm text-ink-muted">
          One row per tenancy: its reference, the home&rsquo;s UPRN, the tenant&rsquo;s name and e-mail address, and the start
          date. Access needs and household vulnerability are kept only where a consent column says yes. At most{" "}
          {TENANCY_IMPORT_MAX_ROWS.toLocaleString("en-GB")} rows and {TENANCY_IMPORT_MAX_MB} MB per file: split a larger list.
        </p>
        <input
          id="tenancy-file"
          type="file"
          accept=".csv,.xlsx,text/csv,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet"
          aria-describedby="tenancy-file-hint"
          onChange={(e) => choose(e.target.files?.[0] ?? null)}
        />
      </div>

      {preview.isPending ? <p role="status">Reading the file…</p> : null}
      {preview.isError ? <Alert tone="danger">{errorMessage(preview.error)}</Alert> : null}

      {preview.data && mapping ? (
        <div className="space-y-3">
          <p>
            {preview.data.rows} rows found in this {preview.data.fileKind === "xlsx" ? "workbook" : "CSV file"}.
          </p>
          {preview.data.missing.length ? (
            <Alert tone="warning" title="Some columns were not recognised">
              Choose the columns for: {preview.data.missing.join(", ")}.
            </Alert>
          ) : null}
          <ColumnMapping headers={preview.data.headers} mapping={mapping} onChange={setMapping} />
          <Button onClick={() => setConfirming(true)} disabled={preview.data.rows === 0}>
            Import {preview.data.rows} rows
          </Button>
        </div>
      ) : null}

      <ConfirmDialog
        open={confirming}
        title="Import these tenancies?"
        confirmLabel="Import"
        busy={importing.isPending}
        error={importing.isError ? errorMessage(importing.error) : null}
        onConfirm={run}
        onCancel={() => setConfirming(false)}
      >
        Tenant accounts and tenancies are created or updated by tenancy reference, all together or not at all. New tenants are
        then invited by e-mail a batch at a time, not all at once.
      </ConfirmDialog>

      {importing.isError && !confirming ? <Alert tone="danger">{errorMessage(importing.error)}</Alert> : null}
      {importing.data ? <ImportResult result={importing.data} /> : null}
    </div>
  );
}
