import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";

interface NotAllowedProps {
  homePath: string;
  homeLabel: string;
  /** Whether to suggest asking the administrator: never to an administrator themself. */
  askAdministrator?: boolean;
}

/** Shown at the URL itself, so the person can see which address their account cannot open. */
export function NotAllowed({ homePath, homeLabel, askAdministrator = true }: NotAllowedProps) {
  return (
    <>
      <title>Not allowed · Dewline</title>
      <PageHeader title="Not allowed" />
      <div className="flex max-w-reading flex-col gap-3 text-base">
        <p>Your account cannot open this page: it is for people with a different role in Dewline.</p>
        {askAdministrator ? (
          <p>If you think you should be able to see it, ask your organisation's Dewline administrator.</p>
        ) : (
          <p>It is for another kind of account, such as a tenant's. Every staff page is in the menu.</p>
        )}
        <p>
          <TextLink to={homePath}>Go to {homeLabel}</TextLink>
        </p>
      </div>
    </>
  );
}
