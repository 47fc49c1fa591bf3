import { apiUrl, type QueryValue } from "@/lib/api-client";
import { textLinkClasses } from "./text-link";

interface ExportLinksProps {
  /** The export route under /api, e.g. "/properties/export". */
  path: string;
  /** The view's current filters and sort (and shown columns): the export holds what the screen shows, every page. */
  query: Record<string, QueryValue>;
  /** What is exported, for the group's name ("homes"). */
  what: string;
}

/**
 * Download the table as on screen, as CSV or an Excel workbook. Plain links: the browser streams the
 * file to disk itself (a large export never sits in the page), shows its own progress, and a keyboard
 * reaches them like any link.
 */
export function ExportLinks({ path, query, what }: ExportLinksProps) {
  const { page: _page, pageSize: _pageSize, ...view } = query;
  return (
    <div role="group" aria-label={`Export ${what}`} className="flex flex-wrap items-center gap-x-3 text-sm">
      <span className="text-ink-soft">Export:</span>
      <a className={textLinkClasses} href={apiUrl(path, { ...view, format: "csv" })} download>
        CSV<span className="sr-only"> file of the {what}</span>
      </a>
      <a className={textLinkClasses} href={apiUrl(path, { ...view, format: "xlsx" })} download>
        Excel<span className="sr-only"> workbook of the {what}</span>
      </a>
    </div>
  );
}
