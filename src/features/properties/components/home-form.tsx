import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import type { z } from "zod";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import {
  BUILT_FORMS,
  GLAZING_TYPES,
  HEATING_TYPES,
  VENTILATION_TYPES,
  WALL_TYPES,
  builtFormLabels,
  glazingTypeLabels,
  heatingTypeLabels,
  ventilationLabels,
  wallTypeLabels,
  type Property,
} from "@/lib/homes";
import { homeSchema } from "@/lib/schemas/homes";
import { useCreateHome, useUpdateHome } from "../api/save-home";

const formSchema = homeSchema.omit({ rooms: true });
type FormIn = z.input<typeof formSchema>;
type FormOut = z.output<typeof formSchema>;
const FIELDS = [
  "addressLine1",
  "addressLine2",
  "town",
  "postcode",
  "uprn",
  "estate",
  "block",
  "builtForm",
  "wallType",
  "glazingType",
  "heatingType",
  "ventilation",
] as const;

const valuesOf = (home: Property | undefined): Partial<FormIn> =>
  home
    ? {
        addressLine1: home.addressLine1,
        addressLine2: home.addressLine2 ?? "",
        town: home.town,
        postcode: home.postcode,
        uprn: home.uprn ?? "",
        estate: home.estate,
        block: home.block ?? "",
        builtForm: home.builtForm,
        wallType: home.wallType,
        glazingType: home.glazingType,
        heatingType: home.heatingType,
        ventilation: home.ventilation,
      }
    : {
        addressLine1: "",
        addressLine2: "",
        town: "",
        postcode: "",
        uprn: "",
        estate: "",
        block: "",
        ventilation: "not-recorded",
      };

function Choices<V extends string>({ values, labels }: { values: readonly V[]; labels: Record<V, string> }) {
  return (
    <>
      <option value="">Choose…</option>
      {values.map((v) => (
        <option key={v} value={v}>
          {labels[v]}
        </option>
      ))}
    </>
  );
}

/** Admin: a new home's details, or an existing home's (checked with the same schema as the server). */
export function HomeForm({
  home,
  onSaved,
  onCancel,
}: {
  home?: Property;
  onSaved: (home: Property) => void;
  onCancel?: () => void;
}) {
  const create = useCreateHome();
  const update = useUpdateHome(home?.id ?? 0);
  const save = home ? update : create;
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<FormIn, unknown, FormOut>({ resolver: zodResolver(formSchema), defaultValues: valuesOf(home) });

  const onSubmit = handleSubmit((values) => {
    const onError = (error: Error) => {
      if (error instanceof ApiError && (error.status === 400 || error.status === 409)) {
        for (const { field, message } of error.fieldErrors) {
          const f = FIELDS.find((k) => k === field);
          if (f) setError(f, { message }, { shouldFocus: true });
        }
      }
    };
    if (home) update.mutate(values, { onSuccess: onSaved, onError });
    else create.mutate({ ...values, rooms: [] }, { onSuccess: onSaved, onError });
  });

  return (
    <form
      onSubmit={onSubmit}
      noValidate
      aria-label={home ? "Edit the home's details" : "New home"}
      className="@container flex flex-col gap-4"
    >
      {save.isError ? (
        <Alert tone="danger" title={home ? "The changes were not saved" : "The home was not added"}>
          {errorMessage(save.error)}
        </Alert>
      ) : null}
      <div className="grid grid-cols-1 gap-3 @xl:grid-cols-2">
        <Input
          label="Address, first line"
          autoComplete="off"
          error={errors.addressLine1?.message}
          {...register("addressLine1")}
        />
        <Input
          label="Address, second line"
          optional
          autoComplete="off"
          error={errors.addressLine2?.message}
          {...register("addressLine2")}
        />
        <Input label="Town" autoComplete="off" error={errors.town?.message} {...register("town")} />
        <Input
          label="Postcode"
          autoComplete="off"
          spellCheck={false}
          error={errors.postcode?.message}
          {...register("postcode")}
        />
        <Input
          label="UPRN"
          optional
          inputMode="numeric"
          hint="The Unique Property Reference Number: up to 12 digits."
          autoComplete="off"
          error={errors.uprn?.message}
          {...register("uprn")}
        />
        <Input
          label="Estate"
          hint="Or the street, for a home on no estate."
          error={errors.estate?.message}
          {...register("estate")}
        />
        <Input label="Block" optional error={errors.block?.message} {...register("block")} />
        <Select label="Type of home" error={errors.builtForm?.message} {...register("builtForm")}>
          <Choices values={BUILT_FORMS} labels={builtFormLabels} />
        </Select>
        <Select label="Walls" error={errors.wallType?.message} {...register("wallType")}>
          <Choices values={WALL_TYPES} labels={wallTypeLabels} />
        </Select>
        <Select label="Glazing" error={errors.glazingType?.message} {...register("glazingType")}>
          <Choices values={GLAZING_TYPES} labels={glazingTypeLabels} />
        </Select>
        <Select label="Heating" error={errors.heatingType?.message} {...register("heatingType")}>
          <Choices values={HEATING_TYPES} labels={heatingTypeLabels} />
        </Select>
        <Select label="Ventilation" error={errors.ventilation?.message} {...register("ventilation")}>
          <Choices values={VENTILATION_TYPES} labels={ventilationLabels} />
        </Select>
      </div>
      <div className="flex flex-wrap gap-3">
        <Button type="submit" busy={save.isPending}>
          {home ? "Save the changes" : "Add the home"}
        </Button>
        {onCancel ? (
          <Button variant="secondary" onClick={onCancel} disabled={save.isPending}>
            Cancel
          </Button>
        ) : null}
      </div>
    </form>
  );
}
