import type { QueryClient } from "@tanstack/react-query";
import { useTranslation } from "react-i18next";
import { Link } from "react-router-dom";
import { buttonClasses } from "@/components/ui/button";
import { PageHeader } from "@/components/ui/page-header";
import { signedInAs } from "@/features/auth/api/require-role";
import { myCasesQueryOptions } from "@/features/cases/api/get-my-cases";
import { MyCases } from "@/features/cases/components/case-list";
import { UnreadMessages } from "@/features/conversation/components/unread-messages";
import { useUnreadWords } from "@/features/conversation/tenant-words";
import { WaitingReports } from "@/features/report/components/waiting-reports";
import { useUser } from "@/features/auth/api/get-me";

export const clientLoader = (queryClient: QueryClient) => async () => {
  if (await signedInAs(queryClient, ["tenant"])) void queryClient.prefetchQuery(myCasesQueryOptions());
  return null;
};

export default function MyReportsPage() {
  const user = useUser();
  const { t } = useTranslation("home");
  const unreadWords = useUnreadWords();
  return (
    <>
      <title>{t("reports.title") + t("titleSuffix")}</title>
      <PageHeader
        title={t("reports.title")}
        description={t("reports.description")}
        actions={
          <Link to="/report" className={buttonClasses("primary")}>
            {t("reports.report")}
          </Link>
        }
      />
      <WaitingReports userId={user.id} />
      <UnreadMessages viewer="tenant" words={unreadWords} />
      <MyCases />
    </>
  );
}
