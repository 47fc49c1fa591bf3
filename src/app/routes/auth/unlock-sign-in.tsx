import { useParams } from "react-router-dom";
import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { useOpenSignInLink } from "@/features/auth/api/sign-in-unlock";
import { errorMessage } from "@/lib/api-client";

// A button, not an automatic request: mail scanners that open links must not use up the link.
export default function UnlockSignInPage() {
  const { token = "" } = useParams();
  const unlock = useOpenSignInLink();

  return (
    <>
      <title>Sign in without waiting · Dewline</title>
      <PageHeader
        title="Sign in without waiting"
        description="After several unsuccessful attempts, Dewline asks for a short wait between tries. This link lets you skip the wait in this browser."
      />
      {unlock.isSuccess ? (
        <Alert tone="success" title="You can sign in now">
          <p>
            <TextLink to="/sign-in">Sign in</TextLink> in this browser as usual. If you do not know your password any more,{" "}
            <TextLink to="/forgot-password">choose a new one</TextLink>.
          </p>
        </Alert>
      ) : (
        <div className="flex flex-col gap-4">
          {unlock.isError ? (
            <Alert tone="danger" title="This link did not work">
              {errorMessage(unlock.error)}
            </Alert>
          ) : null}
          <Panel as="div">
            <Button onClick={() => unlock.mutate(token)} disabled={unlock.isPending}>
              Let me sign in in this browser
            </Button>
          </Panel>
        </div>
      )}
    </>
  );
}
