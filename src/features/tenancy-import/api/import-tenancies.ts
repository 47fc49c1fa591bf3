import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { TenancyImportResult, TenancyMapping } from "@/lib/contracts";
import { tenancyImportKeys, userKeys } from "@/lib/query-keys";

export interface ImportTenanciesInput {
  file: File;
  /** The columns as the admin checked them. */
  mapping: TenancyMapping;
}

/** POST /api/tenancy-imports: accounts and tenancies in one go; the invitations are queued. */
export function importTenancies({ file, mapping }: ImportTenanciesInput) {
  const body = new FormData();
  body.append("file", file, file.name);
  body.append("mapping", JSON.stringify(mapping));
  return api.post<TenancyImportResult>("/tenancy-imports", body);
}

export function useImportTenancies() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: tenancyImportKeys.create(),
    mutationFn: importTenancies,
    onSuccess: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: tenancyImportKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
      ]),
  });
}
