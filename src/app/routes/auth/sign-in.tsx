import { useTranslation } from "react-i18next";
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
  const { t } = useTranslation("auth");
  const next = safeNextPath(params.get("next"));
  const signedOut = (location.state as { signedOut?: boolean } | null)?.signedOut;

  if (me.isPending) return <LoadingState />;
  if (me.data) return <Navigate to={next ?? roleHome(me.data.role).path} replace />;

  return (
    <>
      <title>{t("signIn.title") + t("titleSuffix")}</title>
      <PageHeader title={t("signIn.title")} description={t("signIn.description")} />
      <div className="flex flex-col gap-4">
        {signedOut ? <Alert tone="success">{t("signIn.signedOut")}</Alert> : null}
        {next ? (
          <Alert tone="info" live="none">
            {t("signIn.pleaseSignIn")}
          </Alert>
        ) : null}
        <Panel as="div">
          <SignInForm onSignedIn={(user) => navigate(next ?? roleHome(user.role).path, { replace: true })} />
        </Panel>
        <p className="text-sm text-ink-soft">{t("signIn.newHere")}</p>
      </div>
    </>
  );
}
