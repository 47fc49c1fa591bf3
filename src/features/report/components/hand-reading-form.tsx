import { useEffect, useEffectEvent, useId, useMemo, useRef, useState, type KeyboardEvent } from "react";
import { useTranslation } from "react-i18next";
import { ReportStillMatters } from "@/components/risk/cautions";
import { RiskPanel } from "@/components/risk/risk-panel";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { evaluatePoint, type PointResult } from "@/lib/domain";
import { i18n } from "@/lib/i18n/i18n";
import type { HandReading, RoomOption } from "../api/types";
import {
  checkHandReading,
  localNow,
  previewInput,
  type HandReadingErrors,
  type HandReadingFields,
  type ReadingMessage,
} from "../lib/hand-reading";

interface HandReadingFormProps {
  rooms: readonly RoomOption[];
  /** Resolves true (or nothing) when the reading was kept; false keeps the fields as typed. */
  onAdd: (reading: HandReading) => Promise<boolean | void> | boolean | void;
  busy?: boolean;
  /** A message from the server about the last reading. */
  error?: string | null;
  /** Tells the parent whether something is typed but not added yet. */
  onDirtyChange?: (dirty: boolean) => void;
  defaultRoomId?: number;
  headingLevel?: 2 | 3 | 4;
}

const ORDER: (keyof HandReadingFields)[] = [
  "roomId",
  "airTemperatureC",
  "relativeHumidityPct",
  "surfaceTemperatureC",
  "outdoorTemperatureC",
  "takenAt",
];

const blank = (roomId: string): HandReadingFields => ({
  roomId,
  airTemperatureC: "",
  relativeHumidityPct: "",
  surfaceTemperatureC: "",
  outdoorTemperatureC: "",
  takenAt: localNow(),
});

/**
 * One reading from a thermometer and hygrometer (and a surface thermometer, if there is one),
 * with the engine's answer shown as it is typed. Not a <form>: it also sits inside the report form.
 */
export function HandReadingForm({
  rooms,
  onAdd,
  busy,
  error,
  onDirtyChange,
  defaultRoomId,
  headingLevel = 3,
}: HandReadingFormProps) {
  const { t } = useTranslation("report", { i18n });
  const say = (message: ReadingMessage | undefined) =>
    message
      ? t(`reading.error.${message.key}`, {
          ...message.values,
          what: message.values?.what ? t(`reading.what.${message.values.what}`) : undefined,
        })
      : undefined;
  const initialRoom = defaultRoomId ?? (rooms.length === 1 ? rooms[0]!.id : undefined);
  const [fields, setFields] = useState<HandReadingFields>(() => blank(initialRoom ? String(initialRoom) : ""));
  const [errors, setErrors] = useState<HandReadingErrors>({});
  const [added, setAdded] = useState<string | null>(null);
  const previewId = useId();
  const roomRef = useRef<HTMLSelectElement>(null);
  const airRef = useRef<HTMLInputElement>(null);
  const humidityRef = useRef<HTMLInputElement>(null);
  const surfaceRef = useRef<HTMLInputElement>(null);
  const outdoorRef = useRef<HTMLInputElement>(null);
  const takenAtRef = useRef<HTMLInputElement>(null);

  const dirty = Boolean(
    fields.airTemperatureC || fields.relativeHumidityPct || fields.surfaceTemperatureC || fields.outdoorTemperatureC,
  );
  // Told only when `dirty` changes, with the parent's latest callback.
  const tellDirty = useEffectEvent((next: boolean) => onDirtyChange?.(next));
  useEffect(() => tellDirty(dirty), [dirty]);

  const preview = useMemo((): PointResult | null => {
    const input = previewInput(fields);
    if (!input) return null;
    try {
      return evaluatePoint(input);
    } catch {
      return null;
    }
  }, [fields]);

  const set = (key: keyof HandReadingFields) => (e: { target: { value: string } }) => {
    setAdded(null);
    setFields((f) => ({ ...f, [key]: e.target.value }));
    if (errors[key]) setErrors((prev) => ({ ...prev, [key]: undefined }));
  };

  const add = async () => {
    const { reading, errors: found } = checkHandReading(fields);
    setErrors(found);
    if (!reading) {
      const first = ORDER.find((k) => found[k]);
      const controls = {
        roomId: roomRef,
        airTemperatureC: airRef,
        relativeHumidityPct: humidityRef,
        surfaceTemperatureC: surfaceRef,
        outdoorTemperatureC: outdoorRef,
        takenAt: takenAtRef,
      };
      if (first) controls[first].current?.focus();
      return;
    }
    const kept = await onAdd(reading);
    if (kept === false) return;
    const room = rooms.find((r) => r.id === reading.roomId)?.name ?? t("reading.theRoom");
    setAdded(t("reading.addedFor", { room }));
    setFields(blank(fields.roomId));
    airRef.current?.focus();
  };

  // Enter in a text box adds the reading rather than submitting a surrounding form.
  const onKeyDown = (e: KeyboardEvent) => {
    if (e.key === "Enter" && e.target instanceof HTMLInputElement) {
      e.preventDefault();
      void add();
    }
  };

  const Heading = ({ 2: "h2", 3: "h3", 4: "h4" } as const)[headingLevel];

  if (rooms.length === 0) {
    return (
      <Alert tone="info" live="none" title={t("reading.noRoomsTitle")}>
        {t("reading.noRoomsBody")}
      </Alert>
    );
  }

  return (
    <div className="flex flex-col gap-4">
      <Select
        label={t("reading.room")}
        ref={roomRef}
        value={fields.roomId}
        onChange={set("roomId")}
        error={say(errors.roomId)}
        controlClassName="sm:max-w-xs"
      >
        <option value="">{t("reading.chooseRoom")}</option>
        {rooms.map((room) => (
          <option key={room.id} value={room.id} translate="no">
            {room.name}
          </option>
        ))}
      </Select>
      <div className="grid grid-cols-1 gap-4 sm:grid-cols-2">
        <Input
          label={t("reading.air")}
          ref={airRef}
          onKeyDown={onKeyDown}
          inputMode="decimal"
          autoComplete="off"
          value={fields.airTemperatureC}
          onChange={set("airTemperatureC")}
          error={say(errors.airTemperatureC)}
          hint={t("reading.airHint")}
        />
        <Input
          label={t("reading.rh")}
          ref={humidityRef}
          onKeyDown={onKeyDown}
          inputMode="decimal"
          autoComplete="off"
          value={fields.relativeHumidityPct}
          onChange={set("relativeHumidityPct")}
          error={say(errors.relativeHumidityPct)}
          hint={t("reading.rhHint")}
        />
        <Input
          label={t("reading.surface")}
          optional={t("form.optional")}
          ref={surfaceRef}
          onKeyDown={onKeyDown}
          autoComplete="off"
          value={fields.surfaceTemperatureC}
          onChange={set("surfaceTemperatureC")}
          error={say(errors.surfaceTemperatureC)}
          hint={t("reading.surfaceHint")}
        />
        <Input
          label={t("reading.outdoor")}
          optional={t("form.optional")}
          ref={outdoorRef}
          onKeyDown={onKeyDown}
          autoComplete="off"
          value={fields.outdoorTemperatureC}
          onChange={set("outdoorTemperatureC")}
          error={say(errors.outdoorTemperatureC)}
          hint={t("reading.outdoorHint")}
        />
      </div>
      <Input
        label={t("reading.takenAt")}
        type="datetime-local"
        ref={takenAtRef}
        onKeyDown={onKeyDown}
        value={fields.takenAt}
        max={localNow()}
        onChange={set("takenAt")}
        error={say(errors.takenAt)}
        controlClassName="sm:max-w-xs"
      />
      {error ? (
        <Alert tone="danger" title={t("reading.notAdded")}>
          {error}
        </Alert>
      ) : null}
      <div className="flex flex-wrap items-center gap-3">
        <Button variant="secondary" onClick={() => void add()} busy={busy}>
          {t("reading.add")}
        </Button>
        {dirty ? (
          <Button
            variant="ghost"
            size="sm"
            onClick={() => {
              setFields(blank(fields.roomId));
              setErrors({});
            }}
          >
            {t("reading.clear")}
          </Button>
        ) : null}
      </div>
      <p role="status" className="text-sm font-semibold text-moss-700">
        {added}
      </p>

      <section aria-labelledby={`${previewId}-heading`} className="flex flex-col gap-3">
        <Heading id={`${previewId}-heading`} className="text-lg font-bold">
          {t("reading.shows")}
        </Heading>
        {preview ? <RiskPanel result={preview} compact /> : <p className="text-ink-soft">{t("reading.typeToSee")}</p>}
        <ReportStillMatters />
      </section>
    </div>
  );
}
