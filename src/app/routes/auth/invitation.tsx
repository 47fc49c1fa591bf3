import { Trans, useTranslation } from "react-i18next";
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
  const { t } = useTranslation("auth");

  if (accept.isSuccess) {
    return (
      <>
        <title>{t("invitation.readyPageTitle") + t("titleSuffix")}</title>
        <PageHeader title={t("invitation.readyTitle")} />
        <Alert tone="success" title={t("invitation.passwordSet")}>
          <p>
            <Trans t={t} i18nKey="invitation.signInWith" components={{ anchor: <TextLink to="/sign-in" /> }} />
          </p>
        </Alert>
      </>
    );
  }

  if (invitation.isPending) return <LoadingState>{t("invitation.checking")}</LoadingState>;

  if (invitation.isError) {
    return (
      <>
        <title>{t("invitation.linkPageTitle") + t("titleSuffix")}</title>
        <PageHeader title={t("invitation.linkBroken")} />
        <div className="flex flex-col gap-4">
          <Alert tone="danger">{errorMessage(invitation.error)}</Alert>
          <p>
            <Trans t={t} i18nKey="invitation.alreadySet" components={{ anchor: <TextLink to="/sign-in" /> }} />
          </p>
        </div>
      </>
    );
  }

  const { name, email, organisationName } = invitation.data;
  return (
    <>
      <title>{t("invitation.welcomePageTitle") + t("titleSuffix")}</title>
      <PageHeader
        title={<Trans t={t} i18nKey="invitation.welcome" values={{ name }} />}
        description={
          <Trans
            t={t}
            i18nKey="invitation.invited"
            values={{ organisation: organisationName, email }}
            components={{ email: <strong className="text-ink" translate="no" /> }}
          />
        }
      />
      <Panel as="div">
        <NewPasswordForm
          submitLabel={t("invitation.submit")}
          pending={accept.isPending}
          error={accept.error}
          onSubmit={(password) => accept.mutate({ token, password })}
        />
      </Panel>
    </>
  );
}
