import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useId, useRef, useState } from "react";
import { useForm } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmDialog } from "@/components/ui/dialog";
import { Input } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { ApiError, errorMessage } from "@/lib/api-client";
import { usePolicy } from "../api/get-policy";
import { useResetPolicy } from "../api/reset-policy";
import { amount, ENGLAND_DEFAULT, POLICY_FIELDS, type PolicyView } from "../api/types";
import { fromFormValues, policyFormSchema, toFormValues, useUpdatePolicy, type PolicyFormValues } from "../api/update-policy";

interface Notice {
  tone: "success" | "info";
  text: string;
}

/** The landlord's deadline timeframes: what is in force, changing them, and going back to the England default. */
export function PolicyForm() {
  const policy = usePolicy();
  const [notice, setNotice] = useState<Notice | null>(null);

  if (policy.isPending) return <LoadingState>Loading your deadline timeframes…</LoadingState>;
  if (policy.isError) {
    return (
      <Alert tone="danger" title="We could not load your deadline timeframes">
        <p>{errorMessage(policy.error)}</p>
        <Button size="sm" variant="secondary" className="mt-2" onClick={() => void policy.refetch()} busy={policy.isFetching}>
          Try again
        </Button>
      </Alert>
    );
  }
  // A new answer from the server (saved, or back to the default) starts the form afresh from it.
  const key = POLICY_FIELDS.map((f) => policy.data[f.name]).join("-") + policy.data.source + (policy.data.emergencyPhone ?? "");
  return <PolicyEditor key={key} policy={policy.data} notice={notice} onNotice={setNotice} />;
}

/** "emergencyMakeSafeHours must be at most 72 hours." → "Must be at most 72 hours." */
function fieldMessage(field: string, message: string): string {
  const rest = message.startsWith(`${field} `) ? message.slice(field.length + 1) : message;
  return rest.charAt(0).toUpperCase() + rest.slice(1);
}

function PolicyEditor({
  policy,
  notice,
  onNotice,
}: {
  policy: PolicyView;
  notice: Notice | null;
  onNotice: (n: Notice | null) => void;
}) {
  const update = useUpdatePolicy();
  const reset = useResetPolicy();
  const [confirming, setConfirming] = useState(false);
  const noteId = useId();
  const {
    register,
    handleSubmit,
    setError,
    formState: { errors },
  } = useForm<PolicyFormValues>({ resolver: zodResolver(policyFormSchema), defaultValues: toFormValues(policy) });
  const own = policy.source === "landlord";
  // Saving starts the form afresh from the server's answer (a new key), which takes away the button that
  // had focus: focus goes to the notice saying what happened, not to the page's start (WCAG 2.4.3).
  const noticeRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (notice) noticeRef.current?.focus();
  }, [notice]);

  const onSubmit = handleSubmit((values) => {
    onNotice(null);
    update.mutate(fromFormValues(values), {
      onSuccess: () =>
        onNotice({
          tone: "success",
          text: "Saved. Your own timeframes are in force, and the deadlines of open cases are being worked out again.",
        }),
      onError: (error) => {
        if (error instanceof ApiError && error.status === 400) {
          for (const { field, message } of error.fieldErrors) {
            const f = POLICY_FIELDS.find((p) => p.name === field);
            if (f) setError(f.name, { message: fieldMessage(field, message) });
            else if (field === "emergencyPhone") setError("emergencyPhone", { message: fieldMessage(`${field}:`, message) });
          }
        }
      },
    });
  });

  const goBack = () => {
    reset.mutate(undefined, {
      onSuccess: () => {
        setConfirming(false);
        onNotice({
          tone: "success",
          text: "The England default is in force again. The deadlines of open cases are being worked out again.",
        });
      },
    });
  };

  const fieldErrorsFromServer =
    update.error instanceof ApiError && update.error.status === 400 && update.error.fieldErrors.length > 0;

  return (
    <div className="flex flex-col gap-5">
      <Alert tone="info" live="none" title={own ? "Your own timeframes are in force" : "The England default is in force"}>
        {own
          ? "Your organisation has set its own timeframes. They apply to every case instead of the England default."
          : "These are the timeframes for social-housing landlords in England. Change any of them and save to set your own."}
      </Alert>

      {notice ? (
        <div ref={noticeRef} tabIndex={-1}>
          <Alert tone={notice.tone}>{notice.text}</Alert>
        </div>
      ) : null}

      <form onSubmit={onSubmit} noValidate aria-describedby={noteId} className="flex flex-col gap-5">
        {update.isError ? (
          <Alert tone="danger" title="Your timeframes were not saved">
            {fieldErrorsFromServer ? "Check the timeframes marked below." : errorMessage(update.error)}
          </Alert>
        ) : null}

        <fieldset className="flex flex-col gap-5">
          <legend className="sr-only">Timeframes</legend>
          {POLICY_FIELDS.map((f) => (
            <Input
              key={f.name}
              label={f.label}
              hint={
                <>
                  {f.explanation}{" "}
                  <span className="whitespace-nowrap">England default: {amount(ENGLAND_DEFAULT[f.name], f.unit)}.</span>{" "}
                  <span className="whitespace-nowrap">
                    From {f.min} to {f.max} {f.unit.many}.
                  </span>
                </>
              }
              error={errors[f.name]?.message}
              inputMode="numeric"
              autoComplete="off"
              controlClassName="max-w-32"
              {...register(f.name)}
            />
          ))}
        </fieldset>

        <Input
          label="Emergency telephone number"
          hint="The number tenants call out of hours when something is dangerous, such as water coming through a ceiling near lights or sockets. It is given in the e-mail that confirms a report and in the written summary. A UK number, for example 0300 123 4567."
          error={errors.emergencyPhone?.message}
          type="tel"
          inputMode="tel"
          autoComplete="off"
          controlClassName="max-w-72"
          {...register("emergencyPhone")}
        />

        <div id={noteId} className="flex flex-col gap-2 rounded-md border border-line bg-paper px-4 py-3 text-sm text-ink">
          <p>
            The deadlines of every open case follow this policy: when you save, or go back to the England default, their due dates
            are worked out again.
          </p>
          <p>
            Working days leave out Saturdays, Sundays and bank holidays in England and Wales. The day something happens is day 0.
          </p>
          <p>
            If you set a timeframe longer than the England default, check that it still meets the law that applies to your homes.
          </p>
        </div>

        <div className="flex flex-wrap gap-3">
          <Button type="submit" busy={update.isPending}>
            Save
          </Button>
          {own ? (
            <Button
              variant="secondary"
              onClick={() => {
                reset.reset();
                setConfirming(true);
              }}
            >
              Go back to the England default
            </Button>
          ) : null}
        </div>
      </form>

      <ConfirmDialog
        open={confirming}
        title="Go back to the England default?"
        confirmLabel="Go back to the England default"
        tone="danger"
        busy={reset.isPending}
        error={reset.isError ? errorMessage(reset.error) : null}
        onConfirm={goBack}
        onCancel={() => setConfirming(false)}
      >
        <p>
          Your own timeframes{policy.emergencyPhone ? " and your emergency telephone number" : ""} will be removed, and these will
          apply to every case:
        </p>
        <ul className="mt-2 list-disc pl-5">
          {POLICY_FIELDS.map((f) => (
            <li key={f.name}>
              {f.label.replace(/ \(.*\)$/, "")} {amount(ENGLAND_DEFAULT[f.name], f.unit)}
            </li>
          ))}
        </ul>
        <p className="mt-2">The deadlines of open cases will be worked out again.</p>
      </ConfirmDialog>
    </div>
  );
}
