import { useParams } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { useResetPassword } from "@/features/auth/api/reset-password";
import { NewPasswordForm } from "@/features/auth/components/new-password-form";

export default function ResetPasswordPage() {
  const { token = "" } = useParams();
  const reset = useResetPassword();

  return (
    <>
      <title>Choose a new password · Dewline</title>
      <PageHeader title="Choose a new password" />
      {reset.isSuccess ? (
        <Alert tone="success" title="Your password has been changed">
          <p>
            You can now <TextLink to="/sign-in">sign in with your new password</TextLink>.
          </p>
        </Alert>
      ) : (
        <div className="flex flex-col gap-4">
          <Panel as="div">
            <NewPasswordForm
              submitLabel="Save new password"
              pending={reset.isPending}
              error={reset.error}
              onSubmit={(password) => reset.mutate({ token, password })}
            />
          </Panel>
          {reset.isError ? (
            <p>
              <TextLink to="/forgot-password">Ask for a new link</TextLink>
            </p>
          ) : null}
        </div>
      )}
    </>
  );
}
