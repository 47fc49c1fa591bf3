import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { TenancyImportForm } from "@/features/tenancy-import/components/tenancy-import-form";
import { TenancyImportsList } from "@/features/tenancy-import/components/tenancy-imports-list";

export default function TenancyImportPage() {
  return (
    <>
      <title>Tenancy import · Dewline</title>
      <PageHeader
        title="Tenancy import"
        description="Bring in your tenancies from your housing management system: a CSV or .xlsx file with one row per tenancy, matched to your homes by UPRN. Importing the same file again updates what changed."
      />
      <Panel title="Import a file" id="tenancy-import">
        <TenancyImportForm />
      </Panel>
      <Panel title="Imports and invitations" id="tenancy-imports" className="mt-4">
        <TenancyImportsList />
      </Panel>
    </>
  );
}
