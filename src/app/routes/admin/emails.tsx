import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { OutboxTable } from "@/features/outbox/components/outbox-table";

export default function EmailsPage() {
  return (
    <>
      <title>E-mails · Dewline</title>
      <PageHeader
        title="E-mails"
        description="Every e-mail Dewline sends for your organisation, and whether it went. One that could not be sent is tried again by itself; you can also send one again."
      />
      <Panel title="E-mails" id="emails">
        <OutboxTable />
      </Panel>
    </>
  );
}
