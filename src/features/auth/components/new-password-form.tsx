import { zodResolver } from "@hookform/resolvers/zod";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Input } from "@/components/ui/field";
import { errorMessage } from "@/lib/api-client";

/** The same limits as the server: 10 to 200 characters. */
export const newPasswordFormSchema = z
  .object({
    password: z.string().min(10, "Use at least 10 characters.").max(200, "Use at most 200 characters."),
    confirm: z.string().min(1, "Type the password again."),
  })
  .refine((v) => v.password === v.confirm, { path: ["confirm"], message: "The two passwords are not the same." });
export type NewPasswordFormInput = z.infer<typeof newPasswordFormSchema>;

interface NewPasswordFormProps {
  submitLabel: string;
  pending: boolean;
  error: unknown;
  onSubmit: (password: string) => void;
}

/** Choose a password, twice. Used when accepting an invitation and when resetting a password. */
export function NewPasswordForm({ submitLabel, pending, error, onSubmit }: NewPasswordFormProps) {
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
        <Alert tone="danger" title="That did not work">
          {errorMessage(error)}
        </Alert>
      ) : null}
      <Input
        label="New password"
        type="password"
        autoComplete="new-password"
        hint="At least 10 characters. A few unrelated words make a strong password that is easy to remember."
        error={errors.password?.message}
        {...register("password")}
      />
      <Input
        label="Type the new password again"
        type="password"
        autoComplete="new-password"
        error={errors.confirm?.message}
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
