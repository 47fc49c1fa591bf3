import { Trans, useTranslation } from "react-i18next";
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
  const { t } = useTranslation("auth");

  return (
    <>
      <title>{t("unlock.title") + t("titleSuffix")}</title>
      <PageHeader title={t("unlock.title")} description={t("unlock.description")} />
      {unlock.isSuccess ? (
        <Alert tone="success" title={t("unlock.canSignIn")}>
          <p>
            <Trans
              t={t}
              i18nKey="unlock.signInAsUsual"
              components={{ signIn: <TextLink to="/sign-in" />, reset: <TextLink to="/forgot-password" /> }}
            />
          </p>
        </Alert>
      ) : (
        <div className="flex flex-col gap-4">
          {unlock.isError ? (
            <Alert tone="danger" title={t("unlock.didNotWork")}>
              {errorMessage(unlock.error)}
            </Alert>
          ) : null}
          <Panel as="div">
            <Button onClick={() => unlock.mutate(token)} disabled={unlock.isPending}>
              {t("unlock.submit")}
            </Button>
          </Panel>
        </div>
      )}
    </>
  );
}
