import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";
import { forgotPasswordSchema, useRequestPasswordReset, type ForgotPasswordInput } from "../api/request-password-reset";

export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const {
    register,
    handleSubmit,
    formState: { errors },
  } = useForm<ForgotPasswordInput>({ resolver: zodResolver(forgotPasswordSchema), defaultValues: { email: "" } });

  if (request.isSuccess) {
    return (
      <Alert tone="success" title="Check your e-mail">
        <p>{request.data.message}</p>
        <p className="mt-2">
          The link works for one hour. If nothing arrives, check your junk folder or ask your landlord's team for help.
        </p>
      </Alert>
    );
  }

  return (
    <form onSubmit={handleSubmit((v) => request.mutate(v))} noValidate className="flex flex-col gap-4">
      {request.error ? <Alert tone="danger">{errorMessage(request.error)}</Alert> : null}
      <Input
        label="E-mail address"
        type="email"
        autoComplete="email"
        inputMode="email"
        spellCheck={false}
        hint="We will send a link to choose a new password to this address, if it belongs to an account."
        error={errors.email?.message}
        {...register("email")}
      />
      <div>
        <Button type="submit" size="lg" busy={request.isPending}>
          Send the link
        </Button>
      </div>
    </form>
  );
}
