import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { useErrorWords } from "./error-words";

interface NotAllowedProps {
  homePath: string;
  homeLabel: string;
  /** Whether to suggest asking the administrator: never to an administrator themself. */
  askAdministrator?: boolean;
}

/** Shown at the URL itself, so the person can see which address their account cannot open. */
export function NotAllowed({ homePath, homeLabel, askAdministrator = true }: NotAllowedProps) {
  const w = useErrorWords();
  return (
    <>
      <title>{`${w.notAllowedTitle}${w.titleSuffix}`}</title>
      <PageHeader title={w.notAllowedTitle} />
      <div className="flex max-w-reading flex-col gap-3 text-base">
        <p>{w.notAllowedText}</p>
        {askAdministrator ? <p>{w.notAllowedAsk}</p> : <p>{w.notAllowedOtherKind}</p>}
        <p>
          <TextLink to={homePath}>{w.goTo(homeLabel)}</TextLink>
        </p>
      </div>
    </>
  );
}
