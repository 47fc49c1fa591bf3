import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { useTranslation } from "react-i18next";
import { formMessage } from "../form-message";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { forgotPasswordSchema, useRequestPasswordReset, type ForgotPasswordInput } from "../api/request-password-reset";

export function ForgotPasswordForm() {
  const { t } = useTranslation("auth");
  const request = useRequestPasswordReset();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<ForgotPasswordInput>({ resolver: zodResolver(forgotPasswordSchema), defaultValues: { email: "" } });

  if (request.isSuccess) {
    return (
      <Alert tone="success" title={t("forgot.checkEmail")}>
        <p>{request.data.message}</p>
        <p className="mt-2">{t("forgot.linkHour")}</p>
      </Alert>
    );
  }

  return (
    <form onSubmit={handleSubmit((v) => request.mutate(v))} noValidate className="flex flex-col gap-4">
      {request.error ? <Alert tone="danger">{errorMessage(request.error)}</Alert> : null}
      <Input
        label={t("form.email")}
        type="email"
        autoComplete="email"
        inputMode="email"
        spellCheck={false}
        hint={t("forgot.hint")}
        error={formMessage(t, errors.email?.message)}
        {...register("email")}
      />
      <div>
        <Button type="submit" size="lg" busy={request.isPending}>
          {t("forgot.submit")}
        </Button>
      </div>
    </form>
  );
}
