import { useSearchParams } from "react-router-dom";
import { readPositiveInt, readString, usePatchSearchParams } from "@/lib/search-params";
import { isRole } from "@/lib/roles";
import type { UserListFilters } from "../api/get-users";

export const USERS_DEFAULT_PAGE_SIZE = 25;
const defaults = { page: 1, pageSize: USERS_DEFAULT_PAGE_SIZE };

export function useUsersTableParams() {
  const [params] = useSearchParams();
  const patch = usePatchSearchParams(defaults);
  const role = readString(params, "role");
  const filters: UserListFilters = {
    role: isRole(role) ? role : "",
    q: readString(params, "q"),
    page: readPositiveInt(params, "page", 1),
    pageSize: readPositiveInt(params, "pageSize", USERS_DEFAULT_PAGE_SIZE, 200),
  };
  return {
    filters,
    setSearch: (q: string) => patch({ q: q.trim(), page: 1 }, { replace: true }),
    setRole: (r: string) => patch({ role: r, page: 1 }),
    setPage: (page: number, pageSize: number) => patch({ page, pageSize }),
  };
}
