import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { useTranslation } from "react-i18next";
import { z } from "zod";
import { formMessage } from "../form-message";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";

/** The same limits as the server: 10 to 200 characters. Messages are keys of the `auth` text. */
export const newPasswordFormSchema = z
  .object({
    password: z.string().min(10, "auth:form.passwordTooShort").max(200, "auth:form.passwordTooLong"),
    confirm: z.string().min(1, "auth:form.confirmRequired"),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "auth:form.passwordsDiffer" });
export type NewPasswordFormInput = z.infer<typeof newPasswordFormSchema>;

interface NewPasswordFormProps {
  submitLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (password: string) => void;
}

/** Choose a password, twice. Used when accepting an invitation and when resetting a password. */
export function NewPasswordForm({ submitLabel, pending, error, onSubmit }: NewPasswordFormProps) {
  const { t } = useTranslation("auth");
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<NewPasswordFormInput>({
    resolver: zodResolver(newPasswordFormSchema),
    defaultValues: { password: "", confirm: "" },
  });

  return (
    <form onSubmit={handleSubmit((v) => onSubmit(v.password))} noValidate className="flex flex-col gap-4">
      {error ? (
        <Alert tone="danger" title={t("form.didNotWork")}>
          {errorMessage(error)}
        </Alert>
      ) : null}
      <Input
        label={t("form.newPassword")}
        type="password"
        autoComplete="new-password"
        hint={t("form.newPasswordHint")}
        error={formMessage(t, errors.password?.message)}
        {...register("password")}
      />
      <Input
        label={t("form.newPasswordAgain")}
        type="password"
        autoComplete="new-password"
        error={formMessage(t, errors.confirm?.message)}
        {...register("confirm")}
      />
      <div>
        <Button type="submit" size="lg" busy={pending}>
          {submitLabel}
        </Button>
      </div>
    </form>
  );
}
