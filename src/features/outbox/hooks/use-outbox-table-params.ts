import { useSearchParams } from "react-router-dom";
import { OUTBOX_STATUSES, type OutboxStatusName } from "@/lib/contracts";
import { readPositiveInt, readString, usePatchSearchParams } from "@/lib/search-params";
import type { OutboxFilters } from "../api/get-outbox";

export const OUTBOX_DEFAULT_PAGE_SIZE = 25;
const defaults = { page: 1, pageSize: OUTBOX_DEFAULT_PAGE_SIZE };
const isStatus = (v: string): v is OutboxStatusName => (OUTBOX_STATUSES as readonly string[]).includes(v);

/** The e-mails table's state in the URL (?status=&page=&pageSize=), so a view can be shared and reloaded. */
export function useOutboxTableParams() {
  const [params] = useSearchParams();
  const patch = usePatchSearchParams(defaults);
  const status = readString(params, "status");
  const filters: OutboxFilters = {
    status: isStatus(status) ? status : "",
    page: readPositiveInt(params, "page", 1),
    pageSize: readPositiveInt(params, "pageSize", OUTBOX_DEFAULT_PAGE_SIZE, 200),
  };
  return {
    filters,
    setStatus: (s: string) => patch({ status: s, page: 1 }),
    setPage: (page: number, pageSize: number) => patch({ page, pageSize }),
  };
}
