import { zodResolver } from "@hookform/resolvers/zod";
import { useForm, useWatch } from "react-hook-form";
import { useTranslation } from "react-i18next";
import { formMessage } from "../form-message";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { TextLink } from "@/components/ui/text-link";
import { ApiError, errorMessage } from "@/lib/api-client";
import { signInSchema, useLogin, type SignInInput } from "../api/login";
import { useRequestSignInLink } from "../api/sign-in-unlock";
import type { User } from "../roles";

export function SignInForm({ onSignedIn }: { onSignedIn: (user: User) => void }) {
  const { t } = useTranslation("auth");
  const login = useLogin({ onSuccess: onSignedIn });
  const signInLink = useRequestSignInLink();
  const {
    register,
    handleSubmit,
    setError,
    control,
    formState: { errors },
  } = useForm<SignInInput>({ resolver: zodResolver(signInSchema), defaultValues: { email: "", password: "" } });
  const email = useWatch({ control, name: "email" });

  const onSubmit = handleSubmit((values) => {
    login.mutate(values, {
      onError: (error) => {
        if (error instanceof ApiError && error.status === 400) {
          for (const { field, message } of error.fieldErrors) {
            if (field === "email" || field === "password") setError(field, { message });
          }
        }
      },
    });
  });

  const serverError =
    login.error && !(login.error instanceof ApiError && login.error.status === 400 && login.error.fieldErrors.length)
      ? login.error
      : null;

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4">
      {serverError ? (
        <Alert
          tone="danger"
          title={serverError instanceof ApiError && serverError.status === 429 ? t("signIn.wait") : t("signIn.failed")}
        >
          {errorMessage(serverError)}
          {serverError instanceof ApiError && serverError.status === 429 ? (
            <div className="mt-3">
              {signInLink.isSuccess ? (
                <p role="status">{signInLink.data.message}</p>
              ) : (
                <Button
                  type="button"
                  variant="secondary"
                  disabled={signInLink.isPending || !email}
                  onClick={() => signInLink.mutate(email)}
                >
                  {t("signIn.skipWait")}
                </Button>
              )}
            </div>
          ) : null}
        </Alert>
      ) : null}
      <Input
        label={t("form.email")}
        type="email"
        autoComplete="username"
        inputMode="email"
        spellCheck={false}
        error={formMessage(t, errors.email?.message)}
        {...register("email")}
      />
      <Input
        label={t("form.password")}
        type="password"
        autoComplete="current-password"
        error={formMessage(t, errors.password?.message)}
        {...register("password")}
      />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Button type="submit" size="lg" busy={login.isPending}>
          {t("signIn.submit")}
        </Button>
        <TextLink to="/forgot-password">{t("signIn.forgot")}</TextLink>
      </div>
    </form>
  );
}
