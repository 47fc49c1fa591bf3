import { useEffect, useId, useRef, useState, type FormEvent, type ReactNode } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Input, Select, Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { fixed } from "@/lib/domain/wording";
import { useInspections } from "../api/get-inspections";
import { useRecordInspection } from "../api/record-inspection";
import type { Inspection, MoistureUnit, WorkspaceRoom } from "../api/types";
import {
  checkInspection,
  hasErrors,
  MAX_ROOM_ROWS,
  type InspectionErrors,
  type InspectionFields,
  type RoomRowFields,
} from "../lib/inspection-form";
import { CAUSE_CHOICES, MOISTURE_UNITS, MOULD_EXTENT_CHOICES, labelOf } from "../lib/labels";
import { formatWeekdayDateTimeZoned, londonLocalInput } from "@/lib/dates";
import { QueryState } from "./query-state";
import { RadioGroup } from "@/components/ui/option-radio-group";

let rowSeq = 0;
const blankRow = (roomId = ""): RoomRowFields => ({
  key: `row-${++rowSeq}`,
  roomId,
  airTemperatureC: "",
  relativeHumidityPct: "",
  surfaceTemperaturesC: "",
  moistureValue: "",
  moistureUnit: "pct",
  note: "",
});

const blankForm = (): InspectionFields => ({
  inspectedAt: londonLocalInput(),
  cause: "",
  mouldExtent: "",
  findings: "",
  rooms: [],
});

interface InspectionFormProps {
  caseId: number;
  rooms: readonly WorkspaceRoom[];
  /** The case photo upload, supplied by the page: inspection photos join the case's photos. */
  photoUpload?: ReactNode;
}

/** What was found on site: when, the cause, how much mould, the findings, and readings room by room. */
export function InspectionForm({ caseId, rooms, photoUpload }: InspectionFormProps) {
  const record = useRecordInspection(caseId);
  const [fields, setFields] = useState<InspectionFields>(blankForm);
  const [errors, setErrors] = useState<InspectionErrors>({ rooms: {} });
  const [attempt, setAttempt] = useState(0);
  const [saved, setSaved] = useState<string | null>(null);
  const formRef = useRef<HTMLFormElement>(null);
  const addRef = useRef<HTMLButtonElement>(null);

  // After a failed check, focus goes to the first field with a problem: `attempt` counts only the
  // presses of the button that found one, not the errors clearing as someone types.
  useEffect(() => {
    if (attempt === 0) return;
    const first = formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]');
    // A set of radios marks its group invalid; focus goes to its first radio.
    const target = first?.getAttribute("role") === "radiogroup" ? first.querySelector<HTMLElement>("input") : first;
    target?.focus();
  }, [attempt]);

  const set = <K extends keyof InspectionFields>(key: K, value: InspectionFields[K]) => {
    setSaved(null);
    record.reset();
    setFields((f) => ({ ...f, [key]: value }));
    if (key !== "rooms" && errors[key as Exclude<keyof InspectionErrors, "rooms">])
      setErrors((e) => ({ ...e, [key]: undefined }));
  };

  const setRow = (key: string, patch: Partial<RoomRowFields>) => {
    setSaved(null);
    setFields((f) => ({ ...f, rooms: f.rooms.map((r) => (r.key === key ? { ...r, ...patch } : r)) }));
    if (errors.rooms[key]) setErrors((e) => ({ ...e, rooms: { ...e.rooms, [key]: {} } }));
  };

  const addRow = () => {
    const used = new Set(fields.rooms.map((r) => r.roomId));
    const next = rooms.find((r) => !used.has(String(r.id)));
    setFields((f) => ({ ...f, rooms: [...f.rooms, blankRow(next ? String(next.id) : "")] }));
  };

  const removeRow = (key: string) => {
    setFields((f) => ({ ...f, rooms: f.rooms.filter((r) => r.key !== key) }));
    addRef.current?.focus();
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setSaved(null);
    const { input, errors: found } = checkInspection(fields);
    setErrors(found);
    if (hasErrors(found)) setAttempt((n) => n + 1);
    if (!input) return;
    record.mutate(input, {
      onSuccess: () => {
        setSaved(`Inspection of ${formatWeekdayDateTimeZoned(input.inspectedAt)} recorded.`);
        setFields(blankForm());
        setErrors({ rooms: {} });
        setAttempt(0);
      },
    });
  };

  return (
    <div className="flex flex-col gap-5">
      <form ref={formRef} onSubmit={submit} noValidate className="flex flex-col gap-4">
        <Input
          type="datetime-local"
          label="When the inspection took place"
          hint="UK time."
          value={fields.inspectedAt}
          max={londonLocalInput()}
          error={errors.inspectedAt}
          onChange={(e) => set("inspectedAt", e.target.value)}
          controlClassName="sm:max-w-xs"
        />
        <RadioGroup
          legend="Cause found"
          options={CAUSE_CHOICES}
          value={fields.cause}
          onChange={(v) => set("cause", v)}
          error={errors.cause}
          columns
        />
        <RadioGroup
          legend="How much mould was seen"
          hint="The total area across the home."
          options={MOULD_EXTENT_CHOICES}
          value={fields.mouldExtent}
          onChange={(v) => set("mouldExtent", v)}
          error={errors.mouldExtent}
          columns
        />
        <Textarea
          label="Findings"
          hint="What you saw and measured, and where. Describe the building and its condition."
          rows={5}
          maxLength={8000}
          value={fields.findings}
          error={errors.findings}
          onChange={(e) => set("findings", e.target.value)}
        />

        <fieldset className="flex flex-col gap-3">
          <legend className="mb-1 font-bold">Readings room by room</legend>
          <p className="-mt-1 text-sm text-ink-soft">Optional. Add a row for each room you measured.</p>
          {fields.rooms.length === 0 ? <p className="text-ink-soft">No rooms added.</p> : null}
          {fields.rooms.map((row, i) => (
            <RoomRow
              key={row.key}
              index={i}
              row={row}
              rooms={rooms}
              errors={errors.rooms[row.key] ?? {}}
              onChange={(patch) => setRow(row.key, patch)}
              onRemove={() => removeRow(row.key)}
            />
          ))}
          <div>
            <Button
              ref={addRef}
              variant="secondary"
              onClick={addRow}
              disabled={fields.rooms.length >= MAX_ROOM_ROWS || rooms.length === 0}
            >
              Add a room
            </Button>
            {rooms.length === 0 ? <p className="mt-1 text-sm text-ink-soft">This home has no rooms on record.</p> : null}
          </div>
        </fieldset>

        {hasErrors(errors) ? (
          <Alert tone="danger" title="The inspection was not recorded">
            Please correct the fields marked above.
          </Alert>
        ) : null}
        {record.isError ? (
          <Alert tone="danger" title="The inspection was not recorded">
            {errorMessage(record.error)}
          </Alert>
        ) : null}
        {saved ? (
          <Alert tone="success" title={saved}>
            The deadlines and the timeline now include it.
          </Alert>
        ) : null}
        <div>
          <Button type="submit" busy={record.isPending}>
            Record inspection
          </Button>
        </div>
      </form>
      {photoUpload ? (
        <section aria-labelledby={`case-${caseId}-inspection-photos`} className="flex flex-col gap-2 border-t border-line pt-4">
          <h3 id={`case-${caseId}-inspection-photos`} className="text-lg font-bold">
            Inspection photos
          </h3>
          <p className="text-sm text-ink-soft">Photos are added to the case's photos as soon as they are sent.</p>
          {photoUpload}
        </section>
      ) : null}
    </div>
  );
}

interface RoomRowProps {
  index: number;
  row: RoomRowFields;
  rooms: readonly WorkspaceRoom[];
  errors: NonNullable<InspectionErrors["rooms"][string]>;
  onChange: (patch: Partial<RoomRowFields>) => void;
  onRemove: () => void;
}

function RoomRow({ index, row, rooms, errors, onChange, onRemove }: RoomRowProps) {
  const id = useId();
  const roomName = rooms.find((r) => String(r.id) === row.roomId)?.name;
  const title = `Room ${index + 1}${roomName ? `: ${roomName}` : ""}`;
  return (
    <fieldset aria-labelledby={`${id}-legend`} className="flex flex-col gap-3 rounded-md border border-line bg-paper p-3">
      <div className="flex flex-wrap items-center justify-between gap-2">
        <span id={`${id}-legend`} className="font-semibold">
          {title}
        </span>
        <Button variant="ghost" size="sm" onClick={onRemove}>
          Remove<span className="sr-only"> {title}</span>
        </Button>
      </div>
      <div className="grid grid-cols-1 gap-3 sm:grid-cols-2 lg:grid-cols-3">
        <Select label="Room" value={row.roomId} error={errors.roomId} onChange={(e) => onChange({ roomId: e.target.value })}>
          <option value="">Choose a room</option>
          {rooms.map((r) => (
            <option key={r.id} value={r.id}>
              {r.name}
            </option>
          ))}
        </Select>
        <Input
          label="Air temperature (°C)"
          optional
          inputMode="decimal"
          value={row.airTemperatureC}
          error={errors.airTemperatureC}
          onChange={(e) => onChange({ airTemperatureC: e.target.value })}
        />
        <Input
          label="Relative humidity (%)"
          optional
          inputMode="decimal"
          value={row.relativeHumidityPct}
          error={errors.relativeHumidityPct}
          onChange={(e) => onChange({ relativeHumidityPct: e.target.value })}
        />
        <Input
          label="Surface temperatures (°C)"
          optional
          hint="Separate several with spaces, for example 12.5 13.1."
          value={row.surfaceTemperaturesC}
          error={errors.surfaceTemperaturesC}
          onChange={(e) => onChange({ surfaceTemperaturesC: e.target.value })}
        />
        <div className="flex items-start gap-2">
          <Input
            label="Moisture meter reading"
            optional
            inputMode="decimal"
            value={row.moistureValue}
            error={errors.moistureValue}
            onChange={(e) => onChange({ moistureValue: e.target.value })}
            className="flex-1"
          />
          <Select
            label="Unit"
            value={row.moistureUnit}
            onChange={(e) => onChange({ moistureUnit: e.target.value as MoistureUnit })}
            className="w-24"
          >
            {MOISTURE_UNITS.map((u) => (
              <option key={u.value} value={u.value}>
                {u.label}
              </option>
            ))}
          </Select>
        </div>
        <Input
          label="Note"
          optional
          maxLength={1000}
          value={row.note}
          error={errors.note}
          onChange={(e) => onChange({ note: e.target.value })}
        />
      </div>
    </fieldset>
  );
}

interface InspectionListProps {
  caseId: number;
  rooms: readonly WorkspaceRoom[];
  staffName: (id: number) => string;
}

/** Every inspection recorded for the case, newest first. */
export function InspectionList({ caseId, rooms, staffName }: InspectionListProps) {
  const inspections = useInspections(caseId);
  return (
    <QueryState query={inspections} loading="Loading inspections…" failed="We couldn't load the inspections">
      {(list) =>
        list.length === 0 ? (
          <EmptyState title="No inspection recorded yet">
            The written summary can be sent once the first inspection is recorded.
          </EmptyState>
        ) : (
          <ol className="flex flex-col gap-3">
            {[...list]
              .sort((a, b) => Date.parse(b.inspectedAt) - Date.parse(a.inspectedAt) || b.id - a.id)
              .map((i) => (
                <InspectionItem key={i.id} inspection={i} rooms={rooms} staffName={staffName} />
              ))}
          </ol>
        )
      }
    </QueryState>
  );
}

const num = (v: number | undefined, digits: number, unit: string) => (v === undefined ? null : `${fixed(v, digits)} ${unit}`);

function InspectionItem({
  inspection: i,
  rooms,
  staffName,
}: {
  inspection: Inspection;
  rooms: readonly WorkspaceRoom[];
  staffName: (id: number) => string;
}) {
  const headingId = useId();
  return (
    <li className="flex flex-col gap-2 rounded-md border border-line bg-paper p-3">
      <h4 id={headingId} className="font-bold">
        Inspection of <time dateTime={i.inspectedAt}>{formatWeekdayDateTimeZoned(i.inspectedAt)}</time>
      </h4>
      <dl className="grid grid-cols-1 gap-x-4 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
        {i.inspectorUserId !== undefined ? (
          <>
            <dt className="font-semibold">Inspected by</dt>
            <dd>{staffName(i.inspectorUserId)}</dd>
          </>
        ) : null}
        <dt className="font-semibold">Cause</dt>
        <dd>{labelOf(CAUSE_CHOICES, i.cause)}</dd>
        <dt className="font-semibold">Mould seen</dt>
        <dd>{labelOf(MOULD_EXTENT_CHOICES, i.mouldExtent)}</dd>
        <dt className="font-semibold">Findings</dt>
        <dd className="whitespace-pre-line">{i.findings}</dd>
      </dl>
      {i.roomReadings.length ? (
        <ul className="flex flex-col gap-1 text-sm">
          {i.roomReadings.map((r, n) => {
            const parts = [
              num(r.airTemperatureC, 1, "°C air"),
              num(r.relativeHumidityPct, 0, "% RH"),
              r.surfaceTemperaturesC?.length
                ? `surfaces ${r.surfaceTemperaturesC.map((s) => `${fixed(s, 1)} °C`).join(", ")}`
                : null,
              r.moisture ? `moisture ${fixed(r.moisture.value, 1)} ${r.moisture.unit === "wme" ? "WME" : "%"}` : null,
            ].filter(Boolean);
            return (
              <li key={`${r.roomId}-${n}`}>
                <span className="font-semibold">{rooms.find((room) => room.id === r.roomId)?.name ?? `Room ${r.roomId}`}:</span>{" "}
                {parts.join(", ") || "no readings"}
                {r.note ? <span className="text-ink-soft"> · {r.note}</span> : null}
              </li>
            );
          })}
        </ul>
      ) : null}
    </li>
  );
}
