import { useTranslation } from "react-i18next";
import { SafetyCautions } from "@/components/risk/cautions";
import { PageHeader } from "@/components/ui/page-header";
import { AboutTheNumbers } from "@/features/calculator/components/about-the-numbers";
import { Calculator } from "@/features/calculator/components/calculator";
import { i18n } from "@/lib/i18n/i18n";

export default function CalculatorPage() {
  const { t } = useTranslation("calculator", { i18n });
  return (
    <>
      <title>{t("page.documentTitle")}</title>
      <PageHeader title={t("page.title")} description={t("page.description")} />
      <div className="flex flex-col gap-10">
        <Calculator />
        <AboutTheNumbers />
        <SafetyCautions />
      </div>
    </>
  );
}
