import { useMutation, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import { userKeys } from "@/lib/query-keys";
import type { UserUpdateInput } from "@/lib/schemas/users";
import type { ManagedUser } from "./types";

export type UserChanges = UserUpdateInput;

/** PATCH /api/users/:id: name, role, or status (active or disabled). */
export const updateUser = ({ id, ...changes }: UserChanges & { id: number }) => api.patch<ManagedUser>(`/users/${id}`, changes);

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    onSuccess: (user) =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: userKeys.history(user.id) }),
      ]),
  });
}
