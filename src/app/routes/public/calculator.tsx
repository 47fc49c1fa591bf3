import { SafetyCautions } from "@/components/risk/cautions";
import { PageHeader } from "@/components/ui/page-header";
import { AboutTheNumbers } from "@/features/calculator/components/about-the-numbers";
import { Calculator } from "@/features/calculator/components/calculator";

export default function CalculatorPage() {
  return (
    <>
      <title>Dew point calculator · Dewline</title>
      <PageHeader
        title="Dew point and surface humidity calculator"
        description="Enter a room's temperature and humidity to see its dew point, and how damp the air is at a cold window or wall."
      />
      <div className="flex flex-col gap-10">
        <Calculator />
        <AboutTheNumbers />
        <SafetyCautions />
      </div>
    </>
  );
}
