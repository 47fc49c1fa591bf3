import { Navigate, useLocation, useNavigate, useSearchParams } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { LoadingState } from "@/components/ui/spinner";
import { useMe } from "@/features/auth/api/get-me";
import { SignInForm } from "@/features/auth/components/sign-in-form";
import { roleHome, safeNextPath } from "@/features/auth/roles";

export default function SignInPage() {
  const [params] = useSearchParams();
  const navigate = useNavigate();
  const location = useLocation();
  const me = useMe();
  const next = safeNextPath(params.get("next"));
  const signedOut = (location.state as { signedOut?: boolean } | null)?.signedOut;

  if (me.isPending) return <LoadingState />;
  if (me.data) return <Navigate to={next ?? roleHome(me.data.role).path} replace />;

  return (
    <>
      <title>Sign in · Dewline</title>
      <PageHeader title="Sign in" description="Use the e-mail address and password of your Dewline account." />
      <div className="flex flex-col gap-4">
        {signedOut ? <Alert tone="success">You have signed out.</Alert> : null}
        {next ? (
          <Alert tone="info" live="none">
            Please sign in to open that page.
          </Alert>
        ) : null}
        <Panel as="div">
          <SignInForm onSignedIn={(user) => navigate(next ?? roleHome(user.role).path, { replace: true })} />
        </Panel>
        <p className="text-sm text-ink-soft">
          New to Dewline? Your landlord's team sends you an invitation by e-mail; follow the link in it to set your password.
        </p>
      </div>
    </>
  );
}
