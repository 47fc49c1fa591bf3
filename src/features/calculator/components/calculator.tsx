// The dew point calculator: a form whose result follows every valid change, worked out in the
// browser by the same risk engine the server uses. Nothing typed here leaves the page.
import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useMemo, useState } from "react";
import { useForm, useWatch } from "react-hook-form";
import { ReportStillMatters } from "@/components/risk/cautions";
import { RiskPanel } from "@/components/risk/risk-panel";
import { STATE_LABELS } from "@/lib/surface-state-labels";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Input, Select } from "@/components/ui/field";
import { BUILDING_ELEMENTS, evaluatePoint, getBuildingElement, type PointResult } from "@/lib/domain";
import { celsius, factor, surfaceHumidity } from "@/lib/domain/wording";
import {
  calculatorFormSchema,
  EMPTY_FORM,
  EXAMPLE_FORM,
  FIELD_LABELS,
  fieldMessage,
  REQUIRED_FIELDS,
  type CalculatorField,
  type CalculatorFormValues,
  type CalculatorInput,
} from "../form-schema";
import { useDebouncedValue } from "../hooks/use-debounced-value";

type Outcome =
  { status: "ok"; result: PointResult } | { status: "incomplete"; missing: CalculatorField[] } | { status: "invalid" };

const isBlank = (value: unknown) => value === undefined || value === null || (typeof value === "string" && value.trim() === "");

function evaluateForm(values: CalculatorFormValues): Outcome {
  const parsed = calculatorFormSchema.safeParse(values);
  if (parsed.success) {
    try {
      return { status: "ok", result: evaluatePoint(parsed.data) };
    } catch {
      // The schema's ranges sit inside the engine's, so this is a guard, not a path we expect.
      return { status: "invalid" };
    }
  }
  const wrong = parsed.error.issues.some((issue) => !isBlank(values[issue.path[0] as CalculatorField]));
  if (wrong) return { status: "invalid" };
  return { status: "incomplete", missing: REQUIRED_FIELDS.filter((field) => isBlank(values[field])) };
}

/** What the polite live region says once typing pauses: the state and two numbers, not every figure. */
function announcement(outcome: Outcome): string {
  if (outcome.status === "invalid") return "A value needs correcting. The result shown is for the last valid values.";
  if (outcome.status === "incomplete") return "";
  const { result } = outcome;
  const state = STATE_LABELS[result.surface.state];
  const humidity = surfaceHumidity(result.surface.relativeHumidityPct);
  const frost = result.frostPointC === null ? "" : `; frost point ${celsius(result.frostPointC)}`;
  return `Result: ${state.label}. ${state.summary} Dew point ${celsius(result.dewPointC)}${frost}; relative humidity at the surface ${humidity}.`;
}

const ANNOUNCE_AFTER_MS = 700;

export function Calculator() {
  const resultsHeadingId = useId();
  const {
    register,
    control,
    reset,
    formState: { errors },
  } = useForm<CalculatorFormValues, unknown, CalculatorInput>({
    resolver: zodResolver(calculatorFormSchema),
    mode: "onChange",
    defaultValues: EMPTY_FORM,
  });
  const watched = useWatch({ control });
  // Keyed on the content: useWatch hands over a new object on every render. The key is built from
  // its own copy so nothing read later in render can change it.
  const valuesKey = JSON.stringify({ ...EMPTY_FORM, ...watched });
  const outcome = useMemo(() => evaluateForm(JSON.parse(valuesKey) as CalculatorFormValues), [valuesKey]);
  const values: CalculatorFormValues = { ...EMPTY_FORM, ...watched };

  // Keep the last good result to show (greyed) while a field is being corrected.
  const [lastResult, setLastResult] = useState<PointResult | null>(null);
  if (outcome.status === "ok" && outcome.result !== lastResult) setLastResult(outcome.result);

  const spoken = useDebouncedValue(announcement(outcome), ANNOUNCE_AFTER_MS);

  /** A field's message from the schema, except "required" on a blank field: the prompt covers that. */
  const errorFor = (field: CalculatorField) => (isBlank(values[field]) ? undefined : fieldMessage(field, errors[field]?.message));

  const element = values.element ? getBuildingElement(values.element) : undefined;

  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)] lg:items-start">
      <form noValidate onSubmit={(event) => event.preventDefault()} className="flex flex-col gap-5" aria-label="Readings">
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" onClick={() => reset(EXAMPLE_FORM)}>
            Try an example
          </Button>
          <Button variant="ghost" onClick={() => reset(EMPTY_FORM)}>
            Clear all
          </Button>
        </div>

        <fieldset className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-4">
          <legend className="px-1 text-lg font-bold">The room</legend>
          <Input
            label={`${FIELD_LABELS.airTemperatureC} (°C)`}
            hint="The air in the room, away from windows and heaters."
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            error={errorFor("airTemperatureC")}
            {...register("airTemperatureC")}
          />
          <Input
            label={`${FIELD_LABELS.relativeHumidityPct} (%)`}
            hint="From a hygrometer: most digital room thermometers show it."
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            error={errorFor("relativeHumidityPct")}
            {...register("relativeHumidityPct")}
          />
        </fieldset>

        <fieldset className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-4">
          <legend className="px-1 text-lg font-bold">The cold surface</legend>
          <p className="text-sm text-ink-soft">
            A window, wall or corner you are worried about. Give its temperature if you can measure it, or choose what it is and
            give the outdoor temperature to estimate it.
          </p>
          <Input
            label={`${FIELD_LABELS.surfaceTemperatureC} (°C)`}
            optional
            hint="From a surface or infrared thermometer held at the coldest spot. Below zero, type a minus sign first: -2."
            autoComplete="off"
            spellCheck={false}
            error={errorFor("surfaceTemperatureC")}
            {...register("surfaceTemperatureC")}
          />
          <Input
            label={`${FIELD_LABELS.outdoorTemperatureC} (°C)`}
            optional
            hint="Outside right now, from a thermometer or the weather forecast. Below zero, type a minus sign first: -2."
            autoComplete="off"
            spellCheck={false}
            error={errorFor("outdoorTemperatureC")}
            {...register("outdoorTemperatureC")}
          />
          <Select
            label={FIELD_LABELS.element}
            optional
            hint={
              <>
                With an outdoor temperature, the element gives an estimated surface temperature when none is measured.
                {element ? (
                  <>
                    {" "}
                    Typical temperature factor for this element: {factor(element.fRsi)} ({element.basis}).
                  </>
                ) : null}
              </>
            }
            error={errorFor("element")}
            {...register("element")}
          >
            <option value="">Not chosen</option>
            {BUILDING_ELEMENTS.map((item) => (
              <option key={item.id} value={item.id}>
                {item.label}
              </option>
            ))}
          </Select>
        </fieldset>
        <p className="text-sm text-ink-soft">Worked out on this device as you type: nothing you enter is sent or saved.</p>
      </form>

      <section aria-labelledby={resultsHeadingId} className="flex flex-col gap-4 lg:sticky lg:top-4">
        <h2 id={resultsHeadingId} className="text-xl font-bold">
          Result
        </h2>
        <p role="status" aria-live="polite" className="sr-only">
          {spoken}
        </p>
        <Results outcome={outcome} lastResult={lastResult} />
        <ReportStillMatters />
      </section>
    </div>
  );
}

function Results({ outcome, lastResult }: { outcome: Outcome; lastResult: PointResult | null }) {
  if (outcome.status === "ok") {
    return (
      <>
        <RiskPanel result={outcome.result} />
        <FrostPoint result={outcome.result} />
      </>
    );
  }
  if (outcome.status === "invalid" && lastResult) {
    return (
      <div className="flex flex-col gap-2">
        <p className="rounded-md border border-dashed border-line-strong bg-paper px-3 py-2 font-semibold">
          A value needs correcting: see the message beside the field. Until then, this is the result for the last valid values.
        </p>
        <div className="grayscale" data-stale="true">
          <RiskPanel result={lastResult} className="border-dashed bg-paper" />
          <FrostPoint result={lastResult} />
        </div>
      </div>
    );
  }
  const missing = outcome.status === "incomplete" ? outcome.missing : [];
  return (
    <EmptyState title="Results appear here as you type">
      {missing.length ? (
        <p>
          Enter the {joinAnd(missing.map((field) => FIELD_LABELS[field].toLowerCase()))} to see the dew point and how damp the
          surface is.
        </p>
      ) : (
        <p>Correct the value with a message beside it to see the result.</p>
      )}
    </EmptyState>
  );
}

/**
 * Below 0 °C a cold surface gathers frost before it reaches the dew point (which the engine gives over
 * water, as humidity readings are): the frost point, over ice, is the mark there.
 */
function FrostPoint({ result }: { result: PointResult }) {
  if (result.frostPointC === null) return null;
  const frost = celsius(result.frostPointC);
  return (
    <dl className="rounded-lg border border-line bg-surface p-4">
      <dt className="text-sm font-semibold text-ink-soft">Frost point</dt>
      <dd className="flex flex-col">
        <span className="text-lg font-bold text-ink tabular-nums">{frost}</span>
        <span className="text-sm text-ink-soft">
          Frost would form on a surface at {frost} or colder. Below freezing, the water in the air settles as ice, and it starts a
          little above the dew point.
        </span>
      </dd>
    </dl>
  );
}

const joinAnd = (items: string[]) =>
  items.length <= 1 ? (items[0] ?? "") : `${items.slice(0, -1).join(", ")} and ${items.at(-1)}`;
