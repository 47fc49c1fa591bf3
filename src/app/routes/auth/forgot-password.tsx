import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { ForgotPasswordForm } from "@/features/auth/components/forgot-password-form";

export default function ForgotPasswordPage() {
  return (
    <>
      <title>Forgotten password · Dewline</title>
      <PageHeader
        title="Forgotten your password?"
        description="Tell us the e-mail address you sign in with, and we will send you a link to choose a new password."
      />
      <div className="flex flex-col gap-4">
        <Panel as="div">
          <ForgotPasswordForm />
        </Panel>
        <p>
          <TextLink to="/sign-in">Back to sign in</TextLink>
        </p>
      </div>
    </>
  );
}
