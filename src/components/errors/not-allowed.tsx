import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";

interface NotAllowedProps {
  homePath: string;
  homeLabel: string;
}

/** Shown at the URL itself, so the person can see which address their account cannot open. */
export function NotAllowed({ homePath, homeLabel }: NotAllowedProps) {
  return (
    <>
      <title>Not allowed · Dewline</title>
      <PageHeader title="Not allowed" />
      <div className="flex max-w-reading flex-col gap-3 text-base">
        <p>Your account cannot open this page: it is for people with a different role in Dewline.</p>
        <p>If you think you should be able to see it, ask your organisation's Dewline administrator.</p>
        <p>
          <TextLink to={homePath}>Go to {homeLabel}</TextLink>
        </p>
      </div>
    </>
  );
}
