import { zodResolver } from "@hookform/resolvers/zod";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import type { SensorCredentialsResponse } from "@/lib/contracts";
import { todayInLondon } from "@/lib/dates";
import { sensorCreateSchema, useRegisterSensor, type SensorCreateInput } from "../api/change-sensor";
import { SensorCredentials } from "./sensor-credentials";

/** Common reporting intervals, in seconds (the API takes any whole number from 60 to 86 400). */
const INTERVALS: readonly [number, string][] = [
  [60, "Every minute"],
  [300, "Every 5 minutes"],
  [600, "Every 10 minutes"],
  [900, "Every 15 minutes"],
  [1800, "Every 30 minutes"],
  [3600, "Every hour"],
  [21_600, "Every 6 hours"],
  [86_400, "Once a day"],
];

const DEFAULT_INTERVAL_S = 900;
const FIELDS = ["roomId", "serial", "model", "placement", "measuresSurface", "intervalS", "installedOn"] as const;
type Field = (typeof FIELDS)[number];
const isField = (f: string): f is Field => (FIELDS as readonly string[]).includes(f);

export interface SensorHome {
  id: number;
  addressLine1: string;
  rooms: readonly { id: number; name: string }[];
}

/**
 * Register a sensor in a room of the chosen home (the page supplies the home, and keys the form by it so a
 * new home starts a fresh form). The secret issued with it is shown once, right here, and never again.
 */
export function RegisterSensorForm({ home }: { home: SensorHome | null }) {
  const registerSensor = useRegisterSensor();
  const [created, setCreated] = useState<SensorCredentialsResponse | null>(null);
  const {
    register,
    handleSubmit,
    reset,
    setError,
    formState: { errors },
  } = useForm<SensorCreateInput>({
    resolver: zodResolver(sensorCreateSchema),
    defaultValues: {
      propertyId: home?.id ?? Number.NaN,
      roomId: Number.NaN,
      serial: "",
      model: "",
      placement: "",
      measuresSurface: false,
      intervalS: DEFAULT_INTERVAL_S,
      installedOn: todayInLondon(),
    },
  });

  const onSubmit = handleSubmit((values) => {
    setCreated(null);
    registerSensor.mutate(values, {
      onSuccess: (result) => {
        setCreated(result);
        reset({ ...values, roomId: Number.NaN, serial: "", placement: "" });
      },
      onError: (error) => {
        if (error instanceof ApiError && (error.status === 400 || error.status === 409)) {
          for (const { field, message } of error.fieldErrors) if (isField(field)) setError(field, { message });
        }
      },
    });
  });

  if (created) return <SensorCredentials result={created} onDone={() => setCreated(null)} />;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Register a sensor">
      {registerSensor.isError ? (
        <Alert tone="danger" title="The sensor was not registered">
          {errorMessage(registerSensor.error)}
        </Alert>
      ) : null}
      {errors.propertyId ? (
        <p role="alert" className="text-sm text-rust-700">
          {errors.propertyId.message}
        </p>
      ) : null}
      <Select label="Room" error={errors.roomId?.message} {...register("roomId", { valueAsNumber: true })} className="max-w-md">
        <option value="">{home ? "Choose a room" : "Choose the home first"}</option>
        {(home?.rooms ?? []).map((room) => (
          <option key={room.id} value={room.id}>
            {room.name}
          </option>
        ))}
      </Select>
      <div className="grid gap-4 sm:grid-cols-2">
        <Input
          label="Serial number"
          autoComplete="off"
          spellCheck={false}
          error={errors.serial?.message}
          {...register("serial")}
        />
        <Input label="Model" autoComplete="off" error={errors.model?.message} {...register("model")} />
      </div>
      <Input
        label="Placement"
        hint='Where in the room it sits, e.g. "external wall corner, 0.3 m above floor".'
        autoComplete="off"
        error={errors.placement?.message}
        {...register("placement")}
      />
      <label className="flex items-center gap-2">
        <input type="checkbox" {...register("measuresSurface")} />
        <span>It has a surface temperature probe</span>
      </label>
      <div className="grid gap-4 sm:grid-cols-2">
        <Select
          label="Reporting interval"
          error={errors.intervalS?.message}
          // With valueAsNumber, react-hook-form reads the default from the element rather than writing it there.
          defaultValue={DEFAULT_INTERVAL_S}
          {...register("intervalS", { valueAsNumber: true })}
        >
          {INTERVALS.map(([seconds, label]) => (
            <option key={seconds} value={seconds}>
              {label}
            </option>
          ))}
        </Select>
        <Input label="Installed on" type="date" error={errors.installedOn?.message} {...register("installedOn")} />
      </div>
      <div>
        <Button type="submit" busy={registerSensor.isPending}>
          Register sensor
        </Button>
      </div>
    </form>
  );
}
