import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api, clearCsrfToken } from "@/lib/api-client";
import { authKeys } from "@/lib/query-keys";

export async function logout(): Promise<void> {
  try {
    await api.post<void>("/auth/logout");
  } finally {
    clearCsrfToken();
  }
}

export function useLogout(options: { onSuccess?: () => void } = {}) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...authKeys.all, "logout"],
    mutationFn: logout,
    onSettled: () => {
      // Whatever the server said, this browser no longer shows anyone's data.
      queryClient.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      queryClient.setQueryData(authKeys.me(), null);
      options.onSuccess?.();
    },
  });
}
