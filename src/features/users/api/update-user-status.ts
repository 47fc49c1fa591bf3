import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { ManagedUser } from "./types";
import { userKeys } from "@/lib/query-keys";

export const updateUserStatus = ({ id, status }: { id: number; status: "active" | "disabled" }) =>
  api.patch<ManagedUser>(`/users/${id}`, { status });

export function useUpdateUserStatus() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUserStatus,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}
