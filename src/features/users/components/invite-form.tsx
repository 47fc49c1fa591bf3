import { zodResolver } from "@hookform/resolvers/zod";
import { useState, type ComponentType } from "react";
import { Controller, useForm, useWatch } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input, Select, Textarea } from "@/components/ui/field";
import { ApiError, errorMessage } from "@/lib/api-client";
import { formatDateTime } from "@/lib/dates";
import { roleLabels, type Role } from "@/lib/roles";
import { invitationFormSchema, useCreateInvitation, type InvitationFormInput } from "../api/create-invitation";

export interface HomePickerProps {
  value: number | undefined;
  onChange: (id: number | undefined) => void;
  error?: string;
  label?: string;
}

interface InviteFormProps {
  /** Which roles this person may invite (officers: tenants only). */
  roles: readonly Role[];
  /** The home chooser, supplied by the page (homes belong to another feature). */
  HomePicker: ComponentType<HomePickerProps>;
}

const FIELDS = ["name", "email", "role", "propertyId", "householdNotes"] as const;

export function InviteForm({ roles, HomePicker }: InviteFormProps) {
  const invite = useCreateInvitation();
  const [sent, setSent] = useState<{ name: string; email: string; expiresAt: string } | null>(null);
  const {
    register,
    handleSubmit,
    control,
    reset,
    setError,
    formState: { errors },
  } = useForm<InvitationFormInput>({
    resolver: zodResolver(invitationFormSchema),
    defaultValues: { name: "", email: "", role: roles[0], propertyId: undefined, householdNotes: "" },
  });
  const role = useWatch({ control, name: "role" });

  const onSubmit = handleSubmit((values) => {
    setSent(null);
    invite.mutate(values, {
      onSuccess: (result) => {
        setSent({ name: values.name, email: values.email, expiresAt: result.expiresAt });
        reset({ name: "", email: "", role: values.role, propertyId: undefined, householdNotes: "" });
      },
      onError: (error) => {
        if (error instanceof ApiError && error.status === 400) {
          for (const { field, message } of error.fieldErrors) {
            const f = FIELDS.find((k) => k === field);
            if (f) setError(f, { message });
          }
        }
      },
    });
  });

  return (
    <form onSubmit={onSubmit} noValidate className="@container flex flex-col gap-4">
      {sent ? (
        <Alert tone="success" title={`Invitation sent to ${sent.email}`}>
          {sent.name} will get an e-mail with a link to set a password. The link works until {formatDateTime(sent.expiresAt)}.
        </Alert>
      ) : null}
      {invite.isError ? (
        <Alert tone="danger" title="The invitation was not sent">
          {errorMessage(invite.error)}
        </Alert>
      ) : null}

      <div className="grid grid-cols-1 gap-4 @lg:grid-cols-2">
        <Input label="Name" autoComplete="off" error={errors.name?.message} {...register("name")} />
        <Input
          label="E-mail address"
          type="email"
          autoComplete="off"
          spellCheck={false}
          error={errors.email?.message}
          {...register("email")}
        />
      </div>
      <Select label="Role" error={errors.role?.message} {...register("role")} className="@lg:max-w-xs">
        {roles.map((r) => (
          <option key={r} value={r}>
            {roleLabels[r]}
          </option>
        ))}
      </Select>

      {role === "tenant" ? (
        <>
          <Controller
            control={control}
            name="propertyId"
            render={({ field, fieldState }) => (
              <HomePicker label="Their home" value={field.value} onChange={field.onChange} error={fieldState.error?.message} />
            )}
          />
          <Textarea
            label="Household notes"
            optional
            hint="Anything that helps the team support this household, such as access needs or a preferred language. Only staff can see this."
            error={errors.householdNotes?.message}
            {...register("householdNotes")}
          />
        </>
      ) : null}

      <div>
        <Button type="submit" busy={invite.isPending}>
          Send invitation
        </Button>
      </div>
    </form>
  );
}
