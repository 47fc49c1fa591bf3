import { useTranslation } from "react-i18next";
import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { ForgotPasswordForm } from "@/features/auth/components/forgot-password-form";

export default function ForgotPasswordPage() {
  const { t } = useTranslation("auth");
  return (
    <>
      <title>{t("forgot.pageTitle") + t("titleSuffix")}</title>
      <PageHeader title={t("forgot.title")} description={t("forgot.description")} />
      <div className="flex flex-col gap-4">
        <Panel as="div">
          <ForgotPasswordForm />
        </Panel>
        <p>
          <TextLink to="/sign-in">{t("forgot.back")}</TextLink>
        </p>
      </div>
    </>
  );
}
