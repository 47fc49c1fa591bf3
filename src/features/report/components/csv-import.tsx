import { useEffect, useEffectEvent, useId, useRef, useState } from "react";
import { useTranslation } from "react-i18next";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Select } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { cn } from "@/lib/cn";
import { i18n } from "@/lib/i18n/i18n";
import { useImportReadings } from "../api/import-readings";
import { usePreviewImport } from "../api/preview-import";
import type { ImportPreview, ImportResult, RoomOption } from "../api/types";
import {
  DATE_FORMAT_LABELS,
  MAPPED_COLUMNS,
  REQUIRED_COLUMNS,
  columnCount,
  columnLabels,
  columnName,
  fieldsFromPreview,
  mappingErrors,
  mappingFromFields,
  timeZoneOptions,
  type MappedColumn,
  type MappingFields,
} from "../lib/import-mapping";
import { RadioGroup } from "./choice-fields";

const CSV_ACCEPT = ".csv,.txt,.tsv,text/csv,text/plain,text/tab-separated-values";

interface LoggerFileFieldsProps {
  rooms: readonly RoomOption[];
  file: File | null;
  roomId: number | null;
  onFileChange: (file: File | null) => void;
  onRoomChange: (roomId: number | null) => void;
  fileError?: string;
  roomError?: string;
  disabled?: boolean;
}

/** The logger file and the room it was in. Shared by the report form and the import below. */
export function LoggerFileFields({
  rooms,
  file,
  roomId,
  onFileChange,
  onRoomChange,
  fileError,
  roomError,
  disabled,
}: LoggerFileFieldsProps) {
  const { t } = useTranslation("report", { i18n });
  const id = useId();
  const describedBy = [`${id}-hint`, fileError ? `${id}-error` : null].filter(Boolean).join(" ");
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-col gap-1">
        <label htmlFor={id} className="font-semibold text-ink">
          {t("readings.loggerFile")}
        </label>
        <p id={`${id}-hint`} className="text-sm text-ink-soft">
          {t("readings.loggerHint")}
        </p>
        {fileError ? (
          <p id={`${id}-error`} className="text-sm font-semibold text-rust-700">
            {fileError}
          </p>
        ) : null}
        <input
          id={id}
          type="file"
          accept={CSV_ACCEPT}
          disabled={disabled}
          aria-describedby={describedBy}
          aria-invalid={fileError ? true : undefined}
          onChange={(e) => onFileChange(e.target.files?.[0] ?? null)}
          className={cn(
            "block w-full text-base text-ink file:mr-3 file:min-h-11 file:cursor-pointer file:rounded-md file:border file:border-line-strong",
            "file:bg-surface file:px-4 file:font-semibold file:text-dew-800 hover:file:bg-dew-50 disabled:opacity-60",
          )}
        />
        {file ? (
          <p className="text-sm">
            {t("readings.loggerChosen")}{" "}
            <span className="font-semibold break-all" translate="no">
              {file.name}
            </span>
          </p>
        ) : null}
      </div>
      <Select
        label={t("readings.loggerWhere")}
        hint={t("readings.loggerWhereHint")}
        value={roomId === null ? "" : String(roomId)}
        onChange={(e) => onRoomChange(e.target.value ? Number(e.target.value) : null)}
        error={roomError}
        disabled={disabled}
        controlClassName="sm:max-w-xs"
      >
        <option value="">{t("readings.loggerChooseWhere")}</option>
        {rooms.map((r) => (
          <option key={r.id} value={r.id} translate="no">
            {r.name}
          </option>
        ))}
      </Select>
    </div>
  );
}

interface CsvImportProps {
  caseId: number;
  rooms: readonly RoomOption[];
  /** A file chosen earlier (in the report form): its columns are checked straight away. */
  initialFile?: File | null;
  initialRoomId?: number | null;
  onImported?: (result: ImportResult) => void;
  headingLevel?: 2 | 3 | 4;
}

type Phase = "choose" | "check" | "done";

/** Upload a logger CSV: the server proposes which column is which, the person checks it, then it is imported. */
export function CsvImport({
  caseId,
  rooms,
  initialFile = null,
  initialRoomId = null,
  onImported,
  headingLevel = 3,
}: CsvImportProps) {
  const [file, setFile] = useState<File | null>(initialFile);
  const [roomId, setRoomId] = useState<number | null>(initialRoomId ?? (rooms.length === 1 ? rooms[0]!.id : null));
  const [phase, setPhase] = useState<Phase>("choose");
  const [preview, setPreview] = useState<ImportPreview | null>(null);
  const [fields, setFields] = useState<MappingFields | null>(null);
  const [chooseErrors, setChooseErrors] = useState<{ file?: string; room?: string }>({});
  const [mappingProblems, setMappingProblems] = useState<Partial<Record<MappedColumn, string>>>({});
  const [result, setResult] = useState<ImportResult | null>(null);
  const previewMutation = usePreviewImport(caseId);
  const importMutation = useImportReadings(caseId);
  const checkHeadingRef = useRef<HTMLHeadingElement>(null);
  const doneRef = useRef<HTMLDivElement>(null);
  const Heading = ({ 2: "h2", 3: "h3", 4: "h4" } as const)[headingLevel];

  const sendPreview = (chosen: File) => {
    previewMutation.mutate(chosen, {
      onSuccess: (p) => {
        setPreview(p);
        setFields(fieldsFromPreview(p));
        setMappingProblems({});
        setPhase("check");
      },
    });
  };

  const runPreview = (chosen: File | null, room: number | null) => {
    const errors = {
      file: chosen ? undefined : "Choose the logger file.",
      room: room === null ? "Choose where the logger was." : undefined,
    };
    setChooseErrors(errors);
    if (!chosen || room === null) return;
    sendPreview(chosen);
  };

  // A file handed over from the report form is checked at once: the person already chose it, and
  // with a room known there is nothing to complain about. Runs once, for the handed-over file only.
  const started = useRef(false);
  const previewHandedOver = useEffectEvent(() => {
    if (started.current || !initialFile) return;
    started.current = true;
    if (initialRoomId !== null || rooms.length === 1) sendPreview(initialFile);
  });
  useEffect(() => previewHandedOver(), []);

  useEffect(() => {
    if (phase === "check") checkHeadingRef.current?.focus();
    if (phase === "done") doneRef.current?.focus();
  }, [phase]);

  const runImport = () => {
    if (!file || roomId === null || !preview || !fields) return;
    const problems = mappingErrors(fields);
    setMappingProblems(problems);
    if (Object.keys(problems).length) return;
    importMutation.mutate(
      { file, roomId, mapping: mappingFromFields(preview, fields) },
      {
        onSuccess: (r) => {
          setResult(r);
          setPhase("done");
          onImported?.(r);
        },
      },
    );
  };

  const reset = () => {
    setFile(null);
    setPreview(null);
    setFields(null);
    setResult(null);
    setPhase("choose");
    previewMutation.reset();
    importMutation.reset();
  };

  if (rooms.length === 0) {
    return (
      <Alert tone="info" live="none" title="Readings need a room">
        No rooms are listed for your home yet, so a logger file can't be added. Your landlord's team can add the rooms.
      </Alert>
    );
  }

  if (phase === "done" && result) {
    return (
      <div ref={doneRef} tabIndex={-1} className="flex flex-col gap-3 focus:outline-none">
        <ImportSummary result={result} />
        <div>
          <Button variant="secondary" onClick={reset}>
            Add another logger file
          </Button>
        </div>
      </div>
    );
  }

  if (phase === "check" && preview && fields) {
    const count = columnCount(preview);
    const columnOptions = Array.from({ length: count }, (_, i) => ({ value: String(i), label: columnOptionLabel(preview, i) }));
    const dateFormats = Object.keys(DATE_FORMAT_LABELS).includes(fields.dateFormat)
      ? Object.keys(DATE_FORMAT_LABELS)
      : [fields.dateFormat, ...Object.keys(DATE_FORMAT_LABELS)];
    const setField = <K extends keyof MappingFields>(key: K, value: MappingFields[K]) => {
      setFields((f) => (f ? { ...f, [key]: value } : f));
      setMappingProblems((p) => ({ ...p, [key]: undefined }));
    };

    return (
      <div className="flex flex-col gap-4">
        <Heading ref={checkHeadingRef} tabIndex={-1} className="text-lg font-bold focus:outline-none">
          Check the columns of {file?.name ?? "your file"}
        </Heading>
        <p>We've guessed which column is which. Please check, and change anything that looks wrong.</p>
        {preview.problems.length ? (
          <Alert tone="warning" title="Things to check" live="none">
            <ul className="list-disc space-y-1 pl-5">
              {preview.problems.map((p) => (
                <li key={p}>{p}</li>
              ))}
            </ul>
          </Alert>
        ) : null}
        <SampleTable preview={preview} />

        <fieldset className="flex flex-col gap-4">
          <legend className="mb-1 font-bold">Which column is which</legend>
          <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
            {MAPPED_COLUMNS.map((key) => {
              const required = REQUIRED_COLUMNS.includes(key);
              return (
                <Select
                  key={key}
                  label={columnLabels[key].label}
                  optional={!required}
                  hint={columnLabels[key].hint}
                  value={fields[key]}
                  error={mappingProblems[key]}
                  onChange={(e) => setField(key, e.target.value)}
                >
                  <option value="">{required ? "Choose a column" : "Not in this file"}</option>
                  {columnOptions.map((o) => (
                    <option key={o.value} value={o.value}>
                      {o.label}
                    </option>
                  ))}
                </Select>
              );
            })}
          </div>
        </fieldset>

        <RadioGroup
          legend="Temperatures in the file are in"
          options={[
            { value: "C", label: "Degrees Celsius (°C)" },
            { value: "F", label: "Degrees Fahrenheit (°F)" },
          ]}
          value={fields.temperatureUnit}
          onChange={(v) => setField("temperatureUnit", v ?? "C")}
        />
        <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
          <Select
            label="How dates are written"
            value={fields.dateFormat}
            onChange={(e) => setField("dateFormat", e.target.value)}
          >
            {dateFormats.map((f) => (
              <option key={f} value={f}>
                {DATE_FORMAT_LABELS[f] ?? f}
              </option>
            ))}
          </Select>
          <Select
            label="Time zone of the logger's clock"
            hint="Times that already say Z or +01:00 keep their own offset."
            value={fields.timeZone}
            onChange={(e) => setField("timeZone", e.target.value)}
          >
            {timeZoneOptions(fields.timeZone).map((z) => (
              <option key={z.value} value={z.value}>
                {z.label}
              </option>
            ))}
          </Select>
        </div>

        {importMutation.isError ? (
          <Alert tone="danger" title="The readings were not imported">
            {errorMessage(importMutation.error)}
          </Alert>
        ) : null}
        <div className="flex flex-wrap gap-3">
          <Button onClick={runImport} busy={importMutation.isPending}>
            Import readings
          </Button>
          <Button variant="secondary" onClick={reset} disabled={importMutation.isPending}>
            Choose a different file
          </Button>
        </div>
      </div>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      <LoggerFileFields
        rooms={rooms}
        file={file}
        roomId={roomId}
        onFileChange={(f) => {
          setFile(f);
          setChooseErrors((e) => ({ ...e, file: undefined }));
          previewMutation.reset();
        }}
        onRoomChange={(r) => {
          setRoomId(r);
          setChooseErrors((e) => ({ ...e, room: undefined }));
        }}
        fileError={chooseErrors.file}
        roomError={chooseErrors.room}
        disabled={previewMutation.isPending}
      />
      {previewMutation.isError ? (
        <Alert tone="danger" title="We couldn't read this file">
          {errorMessage(previewMutation.error)}
        </Alert>
      ) : null}
      <div>
        <Button variant="secondary" onClick={() => runPreview(file, roomId)} busy={previewMutation.isPending}>
          Check the file
        </Button>
      </div>
    </div>
  );
}

function columnOptionLabel(preview: ImportPreview, index: number): string {
  const name = columnName(preview, index);
  const sample = preview.sampleRows.find((r) => (r[index] ?? "").trim() !== "")?.[index]?.trim();
  return sample && sample !== name ? `${name} (e.g. ${sample.length > 24 ? `${sample.slice(0, 24)}…` : sample})` : name;
}

function SampleTable({ preview }: { preview: ImportPreview }) {
  const count = columnCount(preview);
  const rows = preview.sampleRows.slice(0, 5);
  if (rows.length === 0) return null;
  return (
    <div
      role="region"
      aria-label="The first rows of your file (scrolls sideways)"
      tabIndex={0}
      className="overflow-x-auto rounded-md border border-line bg-surface"
    >
      <table className="w-full border-collapse text-left text-sm">
        <caption className="px-3 pt-3 pb-1 text-left font-bold">The first rows of your file</caption>
        <thead className="bg-dew-50">
          <tr>
            {Array.from({ length: count }, (_, i) => (
              <th key={i} scope="col" className="border-b border-line-strong px-3 py-2 whitespace-nowrap">
                {columnName(preview, i)}
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {rows.map((row, r) => (
            <tr key={r} className="border-t border-line">
              {Array.from({ length: count }, (_, i) => (
                <td key={i} className="px-3 py-1.5 whitespace-nowrap tabular-nums">
                  {row[i] ?? ""}
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function ImportSummary({ result }: { result: ImportResult }) {
  const plural = (n: number, one: string, many: string) => `${n.toLocaleString("en-GB")} ${n === 1 ? one : many}`;
  return (
    <Alert
      tone={result.imported > 0 ? "success" : "warning"}
      title={result.imported > 0 ? `${plural(result.imported, "reading", "readings")} added` : "No new readings were added"}
    >
      <ul className="list-disc space-y-1 pl-5">
        {result.duplicates > 0 ? (
          <li>{plural(result.duplicates, "reading was", "readings were")} already in your report, so we skipped them.</li>
        ) : null}
        {result.rejected > 0 ? (
          <li>
            {plural(result.rejected, "row", "rows")} couldn't be read.{" "}
            {result.rejectedReportUrl ? (
              <a href={result.rejectedReportUrl} download>
                Download the rows we couldn't read (CSV)
              </a>
            ) : null}
          </li>
        ) : null}
        {result.duplicates === 0 && result.rejected === 0 ? <li>Every row was read.</li> : null}
      </ul>
    </Alert>
  );
}
