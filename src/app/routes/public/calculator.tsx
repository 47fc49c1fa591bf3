import { PageHeader } from "@/components/ui/page-header";

// The risk-engine work fills this page in; the route, its h1 and its place in the app are settled.
export default function CalculatorPage() {
  return (
    <>
      <title>Dew point calculator · Dewline</title>
      <PageHeader title="Dew point and surface humidity calculator" />
      <p className="max-w-reading">
        Soon you will be able to enter a room's temperature and humidity and see the dew point, and how damp the air is at a cold
        wall or window. This calculator is being built.
      </p>
    </>
  );
}
