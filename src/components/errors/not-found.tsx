import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";
import { useErrorWords } from "./error-words";

export function NotFound() {
  const w = useErrorWords();
  return (
    <>
      <title>{`${w.notFoundTitle}${w.titleSuffix}`}</title>
      <PageHeader title={w.notFoundTitle} />
      <div className="flex flex-col gap-3">
        <p>{w.notFoundText}</p>
        <p>
          <TextLink to="/">{w.startPage}</TextLink>
        </p>
      </div>
    </>
  );
}
