import { useParams } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingState } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { useAcceptInvitation } from "@/features/auth/api/accept-invitation";
import { useInvitation } from "@/features/auth/api/get-invitation";
import { NewPasswordForm } from "@/features/auth/components/new-password-form";
import { errorMessage } from "@/lib/api-client";

export default function InvitationPage() {
  const { token = "" } = useParams();
  const invitation = useInvitation(token);
  const accept = useAcceptInvitation();

  if (accept.isSuccess) {
    return (
      <>
        <title>Account ready · Dewline</title>
        <PageHeader title="Your account is ready" />
        <Alert tone="success" title="Your password is set">
          <p>
            <TextLink to="/sign-in">Sign in to Dewline</TextLink> with your e-mail address and the password you just chose.
          </p>
        </Alert>
      </>
    );
  }

  if (invitation.isPending) return <LoadingState>Checking your invitation…</LoadingState>;

  if (invitation.isError) {
    return (
      <>
        <title>Invitation link · Dewline</title>
        <PageHeader title="This invitation link does not work" />
        <div className="flex flex-col gap-4">
          <Alert tone="danger">{errorMessage(invitation.error)}</Alert>
          <p>
            Already set your password? <TextLink to="/sign-in">Sign in</TextLink>.
          </p>
        </div>
      </>
    );
  }

  const { name, email, organisationName } = invitation.data;
  return (
    <>
      <title>Welcome · Dewline</title>
      <PageHeader
        title={`Welcome, ${name}`}
        description={
          <>
            {organisationName} has invited you to Dewline. Choose a password for <strong className="text-ink">{email}</strong> to
            finish setting up your account.
          </>
        }
      />
      <Panel as="div">
        <NewPasswordForm
          submitLabel="Set my password"
          pending={accept.isPending}
          error={accept.error}
          onSubmit={(password) => accept.mutate({ token, password })}
        />
      </Panel>
    </>
  );
}
