import { zodResolver } from "@hookform/resolvers/zod";
import { useId, useState, type FormEvent, type ReactNode } from "react";
import { useForm, useWatch } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import { londonLocalInput, londonLocalToIso } from "@/lib/dates";
import { i18n } from "@/lib/i18n/i18n";
import { STAFF_CHANNELS, VULNERABILITIES, caseReportSchema, type CaseReport } from "@/lib/schemas/case-report";
import { createStaffCase } from "../api/create-case";
import type { CreatedCase, RoomOption } from "../api/types";
import { EQUIPMENT_QUESTIONS, choices, equipmentQuestion } from "../labels";
import { emptyReport, type ReportFormValues } from "../lib/draft";
import { ChoiceField } from "./choice-field";
import { ExclusiveCheckbox } from "./choice-fields";
import { DescribeStep } from "./steps/describe-step";
import { ExtentStep } from "./steps/extent-step";

type StaffChannel = (typeof STAFF_CHANNELS)[number];

export const staffChannelLabels: Record<StaffChannel, string> = {
  phone: "Phone call",
  visit: "Visit (in person)",
  letter: "Letter",
  email: "E-mail",
};

export interface TenantOption {
  userId: number;
  name: string;
  current: boolean;
}

interface StaffReportFormProps {
  /** The home chosen in `homePicker`, with its rooms; undefined until one is chosen. */
  home: { id: number; rooms: readonly RoomOption[] } | undefined;
  /** The home picker (from the properties feature, composed by the page). */
  homePicker: (error: string | undefined) => ReactNode;
  tenants: readonly TenantOption[] | undefined;
  tenantsLoading: boolean;
  onCreated: (created: CreatedCase) => void;
}

/** Staff screens stay in English whatever language the device was last used in. */
const english = () => i18n.getFixedT("en-GB");

type StaffErrors = Partial<Record<"propertyId" | "channel" | "awareAt" | "tenantUserId", string>>;

/**
 * A report received by phone, visit, letter or e-mail, logged by staff: the home, the tenant, how it
 * came in and when, then the same questions as the tenant's own form (the same schema and choices).
 */
export function StaffReportForm({ home, homePicker, tenants, tenantsLoading, onCreated }: StaffReportFormProps) {
  const headingId = useId();
  const form = useForm<ReportFormValues, unknown, CaseReport>({
    resolver: zodResolver(caseReportSchema),
    defaultValues: emptyReport(),
  });
  const [channel, setChannel] = useState<StaffChannel | "">("phone");
  const [awareAt, setAwareAt] = useState(() => londonLocalInput());
  const [tenantUserId, setTenantUserId] = useState<string>("");
  const [householdNone, setHouseholdNone] = useState(false);
  const [staffErrors, setStaffErrors] = useState<StaffErrors>({});
  const [sending, setSending] = useState(false);
  const [sendError, setSendError] = useState<string | null>(null);
  const vulnerability = useWatch({ control: form.control, name: "vulnerability" });
  const t = english();
  const heatingCost = equipmentQuestion(t, "heatingCost");

  const checkStaffFields = (): { errors: StaffErrors; awareIso: string | null } => {
    const errors: StaffErrors = {};
    if (!home) errors.propertyId = "Choose the home the report is about.";
    if (!channel) errors.channel = "Choose how the report came in.";
    const awareIso = londonLocalToIso(awareAt);
    if (!awareIso) errors.awareAt = "Enter the date and time, like 14/01/2026 09:30.";
    else if (new Date(awareIso).getTime() > Date.now() + 60_000) errors.awareAt = "This cannot be in the future.";
    return { errors, awareIso };
  };

  const send = async (report: CaseReport, awareIso: string) => {
    if (!home || !channel) return;
    setSending(true);
    setSendError(null);
    try {
      const created = await createStaffCase({
        ...report,
        propertyId: home.id,
        channel,
        awareAt: awareIso,
        ...(tenantUserId ? { tenantUserId: Number(tenantUserId) } : {}),
      });
      onCreated(created);
    } catch (error) {
      setSending(false);
      if (error instanceof ApiError && error.status === 400 && error.fieldErrors.length) {
        const staff: StaffErrors = {};
        for (const { field, message } of error.fieldErrors) {
          if (field === "propertyId" || field === "channel" || field === "awareAt" || field === "tenantUserId")
            staff[field] = message;
          else if (field in report || field === "description")
            form.setError(field as "description", { message }, { shouldFocus: true });
        }
        setStaffErrors(staff);
      }
      setSendError(errorMessage(error));
    }
  };

  const onSubmit = (event: FormEvent<HTMLFormElement>) => {
    const { errors, awareIso } = checkStaffFields();
    setStaffErrors(errors);
    void form.handleSubmit(
      (report) => {
        if (Object.keys(errors).length || !awareIso) return;
        void send(report, awareIso);
      },
      () => undefined,
    )(event);
  };

  const tenantChoices = tenants ?? [];

  return (
    <form onSubmit={onSubmit} noValidate aria-labelledby={headingId} className="flex flex-col gap-8">
      <h2 id={headingId} className="sr-only">
        Log a report
      </h2>
      <section aria-labelledby={`${headingId}-where`} className="flex flex-col gap-4">
        <h3 id={`${headingId}-where`} className="text-lg font-bold">
          Home, tenant and how it came in
        </h3>
        {homePicker(staffErrors.propertyId)}
        <Select
          label="Tenant"
          optional
          hint={
            !home
              ? "Choose the home first."
              : tenantsLoading
                ? "Loading the home's tenants…"
                : tenantChoices.length
                  ? "Who reported it, if it was a tenant of this home. Left empty, the current tenant is used."
                  : "Nobody has a tenancy of this home: the report is logged without a tenant."
          }
          value={tenantUserId}
          onChange={(e) => setTenantUserId(e.target.value)}
          disabled={!home || tenantsLoading}
          error={staffErrors.tenantUserId}
        >
          <option value="">No tenant chosen</option>
          {tenantChoices.map((t) => (
            <option key={t.userId} value={t.userId}>
              {t.name}
              {t.current ? "" : " (former tenant)"}
            </option>
          ))}
        </Select>
        <Select
          label="How the report came in"
          value={channel}
          onChange={(e) => setChannel(e.target.value as StaffChannel | "")}
          error={staffErrors.channel}
        >
          <option value="">Choose…</option>
          {STAFF_CHANNELS.map((c) => (
            <option key={c} value={c}>
              {staffChannelLabels[c]}
            </option>
          ))}
        </Select>
        <Input
          label="When the landlord became aware"
          hint="London time. The legal deadlines count from here: for a letter, the day it arrived; for a call, the call."
          type="datetime-local"
          value={awareAt}
          max={londonLocalInput()}
          onChange={(e) => setAwareAt(e.target.value)}
          error={staffErrors.awareAt}
        />
      </section>

      <section aria-labelledby={`${headingId}-what`} className="flex flex-col gap-4">
        <h3 id={`${headingId}-what`} className="text-lg font-bold">
          What was reported
        </h3>
        <DescribeStep
          form={form}
          rooms={home?.rooms ?? []}
          describe={{
            label: "What was described",
            hint: "In the caller's or writer's words where you can. For example: black spots on the bedroom ceiling.",
          }}
        />
        <ExtentStep control={form.control} />
      </section>

      <section aria-labelledby={`${headingId}-home`} className="flex flex-col gap-5">
        <h3 id={`${headingId}-home`} className="text-lg font-bold">
          The home's equipment and the household
        </h3>
        <p className="-mt-3 text-ink-soft">Optional: ask only what the tenant is happy to answer.</p>
        {EQUIPMENT_QUESTIONS.map((q) => {
          const question = equipmentQuestion(t, q);
          return (
            <ChoiceField
              key={q}
              control={form.control}
              name={`equipment.${q}`}
              kind="radio"
              legend={question.question}
              hint={question.hint}
              options={question.choices}
              clearLabel={
                <>
                  Clear the answer<span className="sr-only">: {question.question}</span>
                </>
              }
            />
          );
        })}
        <ChoiceField
          control={form.control}
          name="vulnerability"
          kind="checkbox"
          legend="Does anyone in the household fit any of these?"
          hint="Leave it empty if the tenant would rather not say."
          options={choices(t, "vulnerability", VULNERABILITIES)}
          value={householdNone ? [] : (vulnerability ?? [])}
          onChange={(next: never[]) => {
            setHouseholdNone(false);
            form.setValue("vulnerability", next.length ? next : undefined);
          }}
          after={
            <ExclusiveCheckbox
              label={t("report:household.none")}
              checked={householdNone}
              onChange={(checked) => {
                setHouseholdNone(checked);
                form.setValue("vulnerability", checked ? [] : undefined);
              }}
            />
          }
        />
        <ChoiceField
          control={form.control}
          name="equipment.heatingCost"
          kind="radio"
          legend={heatingCost.question}
          hint="Optional, and only if the tenant is happy to say. “Hard to afford” adds the landlord's support route to the home's advice."
          options={heatingCost.choices}
          clearLabel={
            <>
              Clear the answer<span className="sr-only">: {heatingCost.question}</span>
            </>
          }
        />
      </section>

      <div className="flex flex-col gap-3 border-t border-line pt-4">
        {sendError ? (
          <Alert tone="danger" title="The report has not been logged">
            {sendError}
          </Alert>
        ) : null}
        <div>
          <Button type="submit" size="lg" busy={sending}>
            Log the report
          </Button>
        </div>
        <p role="status" className="text-sm font-semibold">
          {sending ? "Logging the report…" : null}
        </p>
      </div>
    </form>
  );
}
