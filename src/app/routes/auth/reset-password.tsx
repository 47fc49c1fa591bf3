import { Trans, useTranslation } from "react-i18next";
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
  const { t } = useTranslation("auth");

  return (
    <>
      <title>{t("reset.title") + t("titleSuffix")}</title>
      <PageHeader title={t("reset.title")} />
      {reset.isSuccess ? (
        <Alert tone="success" title={t("reset.changed")}>
          <p>
            <Trans t={t} i18nKey="reset.signInNow" components={{ anchor: <TextLink to="/sign-in" /> }} />
          </p>
        </Alert>
      ) : (
        <div className="flex flex-col gap-4">
          <Panel as="div">
            <NewPasswordForm
              submitLabel={t("reset.submit")}
              pending={reset.isPending}
              error={reset.error}
              onSubmit={(password) => reset.mutate({ token, password })}
            />
          </Panel>
          {reset.isError ? (
            <p>
              <TextLink to="/forgot-password">{t("reset.askAgain")}</TextLink>
            </p>
          ) : null}
        </div>
      )}
    </>
  );
}
