import { Panel } from "@/components/ui/card";
import { PageHeader } from "@/components/ui/page-header";
import { useUser } from "@/features/auth/api/get-me";
import { PropertyPicker } from "@/features/properties/components/property-picker";
import { InviteForm } from "@/features/users/components/invite-form";
import { UsersTable } from "@/features/users/components/users-table";
import { ROLES } from "@/lib/roles";

export default function UsersAndInvitationsPage() {
  const user = useUser();
  return (
    <>
      <title>Users and invitations · Dewline</title>
      <PageHeader
        title="Users and invitations"
        description="Who can use Dewline in your organisation, and inviting new people."
      />
      <div className="grid grid-cols-1 gap-5 xl:grid-cols-[minmax(0,1fr)_22rem]">
        <Panel title="People" id="people">
          <UsersTable currentUserId={user.id} />
        </Panel>
        <Panel title="Invite someone" id="invite" className="self-start">
          <InviteForm roles={ROLES} HomePicker={PropertyPicker} />
        </Panel>
      </div>
    </>
  );
}
