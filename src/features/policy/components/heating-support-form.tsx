import { useState } from "react";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Textarea } from "@/components/ui/field";
import { LoadingState } from "@/components/ui/spinner";
import { ApiError, errorMessage } from "@/lib/api-client";
import type { HeatingSupportPolicyResponse } from "@/lib/contracts";
import {
  useHeatingSupport,
  useResetHeatingSupport,
  useUpdateHeatingSupport,
  type HeatingSupportFields,
} from "../api/heating-support";

/** The landlord's own help for tenants who say heating is hard to afford, shown beside their home's advice. */
export function HeatingSupportForm() {
  const policy = useHeatingSupport();
  if (policy.isPending) return <LoadingState>Loading your heating support route…</LoadingState>;
  if (policy.isError) return <Alert tone="danger">{errorMessage(policy.error)}</Alert>;
  return <Editor key={JSON.stringify(policy.data)} policy={policy.data} />;
}

function Editor({ policy }: { policy: HeatingSupportPolicyResponse }) {
  const update = useUpdateHeatingSupport();
  const reset = useResetHeatingSupport();
  const [values, setValues] = useState<HeatingSupportFields>({
    supportText: policy.supportText ?? "",
    supportPhone: policy.supportPhone ?? "",
    supportLink: policy.supportLink ?? "",
  });
  const [saved, setSaved] = useState(false);
  const errors = update.error instanceof ApiError && update.error.status === 400 ? update.error.fieldErrors : [];
  const errorOf = (name: keyof HeatingSupportFields) => errors.find((e) => e.field === name)?.message;
  const set = (name: keyof HeatingSupportFields) => (e: { target: { value: string } }) =>
    setValues({ ...values, [name]: e.target.value });

  return (
    <form
      noValidate
      className="flex flex-col gap-4"
      onSubmit={(e) => {
        e.preventDefault();
        setSaved(false);
        update.mutate(values, { onSuccess: () => setSaved(true) });
      }}
    >
      <Alert tone="info" live="none" title={policy.source === "landlord" ? "Your own route is shown" : "No route set yet"}>
        Tenants who say heating is hard to pay for see this beside the advice for their home. Until you set it, they see general
        wording that names no organisation or number. Write it plainly and without blame.
      </Alert>
      {saved ? <Alert tone="success">Saved. Tenants who asked for help see it on their case.</Alert> : null}
      {update.isError && errors.length === 0 ? <Alert tone="danger">{errorMessage(update.error)}</Alert> : null}
      <Textarea
        label="What help you offer"
        hint="A few plain sentences, for example who to talk to about heating bills. Up to 1,000 characters."
        value={values.supportText}
        error={errorOf("supportText")}
        onChange={set("supportText")}
      />
      <Input
        label="Telephone number"
        optional
        hint="A UK number, for example 0300 123 4567."
        inputMode="tel"
        value={values.supportPhone}
        error={errorOf("supportPhone")}
        onChange={set("supportPhone")}
      />
      <Input
        label="Web address"
        optional
        hint="Starting https://."
        inputMode="url"
        value={values.supportLink}
        error={errorOf("supportLink")}
        onChange={set("supportLink")}
      />
      <div className="flex gap-3">
        <Button type="submit" busy={update.isPending}>
          Save the heating support route
        </Button>
        {policy.source === "landlord" ? (
          <Button type="button" variant="secondary" busy={reset.isPending} onClick={() => reset.mutate()}>
            Clear it
          </Button>
        ) : null}
      </div>
    </form>
  );
}
