import { zodResolver } from "@hookform/resolvers/zod";
import { useForm, useWatch } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { TextLink } from "@/components/ui/text-link";
import { ApiError, errorMessage } from "@/lib/api-client";
import { signInSchema, useLogin, type SignInInput } from "../api/login";
import { useRequestSignInLink } from "../api/sign-in-unlock";
import type { User } from "../roles";

export function SignInForm({ onSignedIn }: { onSignedIn: (user: User) => void }) {
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
          title={
            serverError instanceof ApiError && serverError.status === 429 ? "Please wait a little" : "We could not sign you in"
          }
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
                  E-mail me a link to skip the wait
                </Button>
              )}
            </div>
          ) : null}
        </Alert>
      ) : null}
      <Input
        label="E-mail address"
        type="email"
        autoComplete="username"
        inputMode="email"
        spellCheck={false}
        error={errors.email?.message}
        {...register("email")}
      />
      <Input
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...register("password")}
      />
      <div className="flex flex-wrap items-center justify-between gap-3">
        <Button type="submit" size="lg" busy={login.isPending}>
          Sign in
        </Button>
        <TextLink to="/forgot-password">Forgot your password?</TextLink>
      </div>
    </form>
  );
}
