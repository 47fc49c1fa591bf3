import type { QueryClient } from "@tanstack/react-query";
import type { Role } from "@/lib/roles";
import { meQueryOptions } from "./get-me";

/** For loaders that warm the cache: only fetch what the signed-in role may see (others get "Not allowed"). */
export async function signedInAs(queryClient: QueryClient, roles: readonly Role[]): Promise<boolean> {
  const user = await queryClient.ensureQueryData(meQueryOptions());
  return Boolean(user && roles.includes(user.role));
}
