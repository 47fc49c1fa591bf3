import { PageHeader } from "@/components/ui/page-header";
import { TextLink } from "@/components/ui/text-link";

export function NotFound() {
  return (
    <>
      <title>Page not found · Dewline</title>
      <PageHeader title="Page not found" />
      <div className="flex flex-col gap-3">
        <p>There is no page at this address. The link may be mistyped, or the page may have moved.</p>
        <p>
          <TextLink to="/">Go to the start page</TextLink>
        </p>
      </div>
    </>
  );
}
