// The dew point calculator: a form whose result follows every valid change, worked out in the
// browser by the same risk engine the server uses. Nothing typed here leaves the page.
import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useMemo, useState } from "react";
import type { TFunction } from "i18next";
import { useForm, useWatch } from "react-hook-form";
import { useTranslation } from "react-i18next";
import { ReportStillMatters } from "@/components/risk/cautions";
import { RiskPanel, celsiusIn, stateWords, surfaceHumidityIn } from "@/components/risk/risk-panel";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Input, Select } from "@/components/ui/field";
import { BUILDING_ELEMENTS, evaluatePoint, getBuildingElement, type PointResult } from "@/lib/domain";
import { factor } from "@/lib/domain/wording";
import { i18n } from "@/lib/i18n/i18n";
import {
  calculatorFormSchema,
  EMPTY_FORM,
  EXAMPLE_FORM,
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
function announcement(t: TFunction, outcome: Outcome): string {
  if (outcome.status === "invalid") return t("calculator:result.needsCorrecting");
  if (outcome.status === "incomplete") return "";
  const { result } = outcome;
  const state = stateWords(t, result.surface.state);
  const values = {
    label: state.label,
    summary: state.summary,
    dewPoint: celsiusIn(t, result.dewPointC),
    humidity: surfaceHumidityIn(t, result.surface.relativeHumidityPct),
  };
  return result.frostPointC === null
    ? t("calculator:result.announce", values)
    : t("calculator:result.announceFrost", { ...values, frostPoint: celsiusIn(t, result.frostPointC) });
}

const ANNOUNCE_AFTER_MS = 700;

export function Calculator() {
  const { t } = useTranslation("calculator", { i18n });
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

  const spoken = useDebouncedValue(announcement(t, outcome), ANNOUNCE_AFTER_MS);

  /** A field's message from the schema, except "required" on a blank field: the prompt covers that. */
  const errorFor = (field: CalculatorField) => (isBlank(values[field]) ? undefined : fieldMessage(t, field, errors[field]));

  const element = values.element ? getBuildingElement(values.element) : undefined;

  return (
    <div className="grid grid-cols-1 gap-6 lg:grid-cols-[minmax(0,5fr)_minmax(0,7fr)] lg:items-start">
      <form noValidate onSubmit={(event) => event.preventDefault()} className="flex flex-col gap-5" aria-label={t("form.label")}>
        <div className="flex flex-wrap gap-2">
          <Button variant="secondary" onClick={() => reset(EXAMPLE_FORM)}>
            {t("form.example")}
          </Button>
          <Button variant="ghost" onClick={() => reset(EMPTY_FORM)}>
            {t("form.clear")}
          </Button>
        </div>

        <fieldset className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-4">
          <legend className="px-1 text-lg font-bold">{t("form.room")}</legend>
          <Input
            label={t("form.withUnit", { label: t("field.airTemperatureC"), unit: "°C" })}
            hint={t("form.airHint")}
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            error={errorFor("airTemperatureC")}
            {...register("airTemperatureC")}
          />
          <Input
            label={t("form.withUnit", { label: t("field.relativeHumidityPct"), unit: "%" })}
            hint={t("form.rhHint")}
            inputMode="decimal"
            autoComplete="off"
            spellCheck={false}
            error={errorFor("relativeHumidityPct")}
            {...register("relativeHumidityPct")}
          />
        </fieldset>

        <fieldset className="flex flex-col gap-4 rounded-lg border border-line bg-surface p-4">
          <legend className="px-1 text-lg font-bold">{t("form.surfaceLegend")}</legend>
          <p className="text-sm text-ink-soft">{t("form.surfaceIntro")}</p>
          <Input
            label={t("form.withUnit", { label: t("field.surfaceTemperatureC"), unit: "°C" })}
            optional={t("form.optional")}
            hint={t("form.surfaceHint")}
            autoComplete="off"
            spellCheck={false}
            error={errorFor("surfaceTemperatureC")}
            {...register("surfaceTemperatureC")}
          />
          <Input
            label={t("form.withUnit", { label: t("field.outdoorTemperatureC"), unit: "°C" })}
            optional={t("form.optional")}
            hint={t("form.outdoorHint")}
            autoComplete="off"
            spellCheck={false}
            error={errorFor("outdoorTemperatureC")}
            {...register("outdoorTemperatureC")}
          />
          <Select
            label={t("field.element")}
            optional={t("form.optional")}
            hint={
              <>
                {t("form.elementHint")}
                {element ? (
                  <>
                    {" "}
                    {t("form.elementFactor", { factor: Number(factor(element.fRsi)) })}{" "}
                    {/* The basis comes from the domain in English, as the risk engine's reasons do (not yet translated). */}
                    <span>({element.basis})</span>
                  </>
                ) : null}
              </>
            }
            error={errorFor("element")}
            {...register("element")}
          >
            <option value="">{t("form.notChosen")}</option>
            {BUILDING_ELEMENTS.map((item) => (
              <option key={item.id} value={item.id}>
                {t(`risk:element.${item.id}`, { defaultValue: item.label })}
              </option>
            ))}
          </Select>
        </fieldset>
        <p className="text-sm text-ink-soft">{t("form.onDevice")}</p>
      </form>

      <section aria-labelledby={resultsHeadingId} className="flex flex-col gap-4 lg:sticky lg:top-4">
        <h2 id={resultsHeadingId} className="text-xl font-bold">
          {t("result.heading")}
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
  const { t } = useTranslation("calculator", { i18n });
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
        <p className="rounded-md border border-dashed border-line-strong bg-paper px-3 py-2 font-semibold">{t("result.stale")}</p>
        <div className="grayscale" data-stale="true">
          <RiskPanel result={lastResult} className="border-dashed bg-paper" />
          <FrostPoint result={lastResult} />
        </div>
      </div>
    );
  }
  const missing = outcome.status === "incomplete" ? outcome.missing : [];
  return (
    <EmptyState title={t("result.emptyTitle")}>
      {missing.length ? (
        <p>
          {t(missing.length === 2 ? "result.enterBoth" : missing[0] === "airTemperatureC" ? "result.enterAir" : "result.enterRh")}
        </p>
      ) : (
        <p>{t("result.correct")}</p>
      )}
    </EmptyState>
  );
}

/**
 * Below 0 °C a cold surface gathers frost before it reaches the dew point (which the engine gives over
 * water, as humidity readings are): the frost point, over ice, is the mark there.
 */
function FrostPoint({ result }: { result: PointResult }) {
  const { t } = useTranslation("calculator", { i18n });
  if (result.frostPointC === null) return null;
  const frost = celsiusIn(t, result.frostPointC);
  return (
    <dl className="rounded-lg border border-line bg-surface p-4">
      <dt className="text-sm font-semibold text-ink-soft">{t("result.frostPoint")}</dt>
      <dd className="flex flex-col">
        <span className="text-lg font-bold text-ink tabular-nums">{frost}</span>
        <span className="text-sm text-ink-soft">{t("result.frostNote", { frost })}</span>
      </dd>
    </dl>
  );
}
