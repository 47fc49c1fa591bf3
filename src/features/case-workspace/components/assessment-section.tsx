import { useEffect, useId, useRef, useState, type FormEvent } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { FieldError, Input, Select, Textarea } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { HARM_CLASSES, LIKELIHOOD_POINTS, SPREAD_POINTS } from "@/lib/domain/hhsrs";
import { useCreateAssessment } from "../api/create-assessment";
import { useAssessments } from "../api/get-assessments";
import type { Assessment } from "../api/types";
import { checkAssessment, errorsFound, spreadTotal, type AssessmentErrors, type AssessmentFields } from "../lib/assessment-form";
import { formatWeekdayDateTimeZoned } from "@/lib/dates";
import { tenthsText } from "../lib/numbers";
import { QueryState } from "./query-state";

/** The four classes of harm in HHSRS's own words (from memory). */
const CLASS_WORDS = ["extreme", "severe", "serious", "moderate"] as const;

const blank = (): AssessmentFields => ({ likelihood: "", spread: ["", "", "", ""], justification: "" });
const noErrors = (): AssessmentErrors => ({ spread: [] });

const likelihoodText = (l: number) => `1 in ${l.toLocaleString("en-GB")}`;
const categoryText = (a: Pick<Assessment, "category" | "band">) => `Category ${a.category}, band ${a.band}`;

/** A new HHSRS assessment of damp and mould growth: checked as the server checks it, before it is sent. */
export function AssessmentForm({ caseId }: { caseId: number }) {
  const id = useId();
  const create = useCreateAssessment(caseId);
  const [fields, setFields] = useState<AssessmentFields>(blank);
  const [errors, setErrors] = useState<AssessmentErrors>(noErrors);
  const [attempt, setAttempt] = useState(0);
  const [result, setResult] = useState<Assessment | null>(null);
  const formRef = useRef<HTMLFormElement>(null);

  useEffect(() => {
    if (attempt === 0) return;
    formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }, [attempt]);

  const total = spreadTotal(fields.spread);
  const remaining = Math.round((100 - total) * 10) / 10;
  const touched = (key: keyof AssessmentFields) => {
    setResult(null);
    create.reset();
    if (key === "spread") setErrors((e) => ({ ...e, spread: [], spreadTotal: undefined }));
    else setErrors((e) => ({ ...e, [key]: undefined }));
  };

  const submit = (e: FormEvent) => {
    e.preventDefault();
    setResult(null);
    const { input, errors: found } = checkAssessment(fields);
    setErrors(found);
    setAttempt((n) => n + 1);
    if (!input) return;
    create.mutate(input, {
      onSuccess: (saved) => {
        setResult(saved);
        setFields(blank());
        setErrors(noErrors());
      },
    });
  };

  return (
    <form ref={formRef} onSubmit={submit} noValidate className="flex flex-col gap-4">
      <Select
        label="Likelihood of a harmful occurrence in the next 12 months"
        hint="The representative scale point closest to your judgement."
        value={fields.likelihood}
        error={errors.likelihood}
        onChange={(e) => {
          setFields((f) => ({ ...f, likelihood: e.target.value }));
          touched("likelihood");
        }}
        controlClassName="sm:max-w-xs"
      >
        <option value="">Choose the likelihood</option>
        {LIKELIHOOD_POINTS.map((l) => (
          <option key={l} value={l}>
            {likelihoodText(l)}
          </option>
        ))}
      </Select>

      <fieldset
        aria-describedby={`${id}-spread-hint ${id}-total${errors.spreadTotal ? ` ${id}-total-error` : ""}`}
        className="flex flex-col gap-3"
      >
        <legend className="mb-1 font-bold">Spread of harm (%)</legend>
        <p id={`${id}-spread-hint`} className="-mt-1 text-sm text-ink-soft">
          Each class takes a representative point ({SPREAD_POINTS.map((p) => tenthsText(p)).join(", ")}), except one class that
          may hold the remainder. The four must total 100. An empty box counts as 0.
        </p>
        <div className="grid grid-cols-2 gap-3 sm:grid-cols-4">
          {HARM_CLASSES.map((name, i) => (
            <Input
              key={name}
              label={`Class ${name} (${CLASS_WORDS[i]})`}
              inputMode="decimal"
              value={fields.spread[i]}
              error={errors.spread[i]}
              aria-invalid={errors.spread[i] || errors.spreadTotal ? true : undefined}
              onChange={(e) => {
                const next = [...fields.spread] as AssessmentFields["spread"];
                next[i] = e.target.value;
                setFields((f) => ({ ...f, spread: next }));
                touched("spread");
              }}
            />
          ))}
        </div>
        <p id={`${id}-total`} aria-live="polite" className="font-semibold">
          Total: {tenthsText(total)} % of 100 %
          <span className="font-normal text-ink-soft">
            {remaining === 0
              ? " — complete"
              : remaining > 0
                ? ` — ${tenthsText(remaining)} % still to place`
                : ` — ${tenthsText(-remaining)} % too much`}
          </span>
        </p>
        {errors.spreadTotal ? <FieldError id={`${id}-total-error`}>{errors.spreadTotal}</FieldError> : null}
      </fieldset>

      <Textarea
        label="Justification"
        hint="Why you chose this likelihood and spread: what you saw, and who in the household is affected."
        rows={4}
        maxLength={8000}
        value={fields.justification}
        error={errors.justification}
        onChange={(e) => {
          setFields((f) => ({ ...f, justification: e.target.value }));
          touched("justification");
        }}
      />

      {errorsFound(errors) ? (
        <Alert tone="danger" title="The assessment was not sent">
          Please correct the fields marked above.
        </Alert>
      ) : null}
      {create.isError ? (
        <Alert tone="danger" title="The assessment was not saved">
          {errorMessage(create.error)}
        </Alert>
      ) : null}
      {result ? (
        <Alert tone="success" title={`Assessment version ${result.version} saved`}>
          <p>
            Score {result.score.toFixed(2)}: <strong>{categoryText(result)}</strong>, as worked out by Dewline's server.
          </p>
        </Alert>
      ) : null}
      <div>
        <Button type="submit" busy={create.isPending}>
          Save assessment
        </Button>
      </div>
    </form>
  );
}

/** Every version, newest first. A new judgement is a new version; none is ever changed. */
export function AssessmentVersions({ caseId, staffName }: { caseId: number; staffName: (id: number) => string }) {
  const assessments = useAssessments(caseId);
  return (
    <QueryState query={assessments} loading="Loading assessments…" failed="We couldn't load the assessments">
      {(list) =>
        list.length === 0 ? (
          <EmptyState title="No HHSRS assessment yet" />
        ) : (
          <div className="flex flex-col gap-2">
            <p className="text-sm text-ink-soft">
              Each assessment is kept as its own version; earlier versions are never changed.
            </p>
            <ol className="flex flex-col gap-3">
              {[...list]
                .sort((a, b) => b.version - a.version)
                .map((a, i) => (
                  <li key={a.id} className="flex flex-col gap-1 rounded-md border border-line bg-paper p-3">
                    <h4 className="font-bold">
                      Version {a.version}
                      {i === 0 ? <span className="font-normal text-ink-soft"> (latest)</span> : null}: {categoryText(a)}
                    </h4>
                    <p className="text-sm text-ink-soft">
                      <time dateTime={a.createdAt}>{formatWeekdayDateTimeZoned(a.createdAt)}</time>, by {staffName(a.assessorId)}
                    </p>
                    <dl className="grid grid-cols-1 gap-x-4 gap-y-1 text-sm sm:grid-cols-[auto_1fr]">
                      <dt className="font-semibold">Score</dt>
                      <dd className="tabular-nums">{a.score.toFixed(2)}</dd>
                      <dt className="font-semibold">Likelihood</dt>
                      <dd>{likelihoodText(a.likelihood)}</dd>
                      <dt className="font-semibold">Spread of harm</dt>
                      <dd>{a.spread.map((v, n) => `Class ${HARM_CLASSES[n]} ${tenthsText(v)} %`).join(", ")}</dd>
                      <dt className="font-semibold">Justification</dt>
                      <dd className="whitespace-pre-line">{a.justification}</dd>
                    </dl>
                  </li>
                ))}
            </ol>
          </div>
        )
      }
    </QueryState>
  );
}
