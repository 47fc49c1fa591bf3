import { useMutation, useQueryClient } from "@tanstack/react-query";
import type { z } from "zod";
import { api } from "@/lib/api-client";
import type { Property, Room } from "@/lib/homes";
import { propertyKeys } from "@/lib/query-keys";
import type { homePatchSchema, homeSchema, roomPatchSchema, roomSchema } from "@/lib/schemas/homes";

export type NewHome = z.input<typeof homeSchema>;
export type HomeChanges = z.input<typeof homePatchSchema>;
export type NewRoom = z.input<typeof roomSchema>;
export type RoomChanges = z.input<typeof roomPatchSchema>;

/** Admin: POST /api/properties. */
export function useCreateHome() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (home: NewHome) => api.post<Property>("/properties", home),
    onSuccess: (home) => {
      queryClient.setQueryData(propertyKeys.detail(home.id), home);
      void queryClient.invalidateQueries({ queryKey: propertyKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: propertyKeys.estates() });
    },
  });
}

/** Admin: PATCH /api/properties/:id. */
export function useUpdateHome(id: number) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (changes: HomeChanges) => api.patch<Property>(`/properties/${id}`, changes),
    onSuccess: (home) => {
      queryClient.setQueryData(propertyKeys.detail(id), home);
      void queryClient.invalidateQueries({ queryKey: propertyKeys.lists() });
      void queryClient.invalidateQueries({ queryKey: propertyKeys.estates() });
    },
  });
}

/** Admin: add, rename or remove a room; the home is read again afterwards. */
export function useRoomChanges(homeId: number) {
  const queryClient = useQueryClient();
  const refresh = () => queryClient.invalidateQueries({ queryKey: propertyKeys.detail(homeId) });
  return {
    add: useMutation({
      mutationFn: (room: NewRoom) => api.post<Room>(`/properties/${homeId}/rooms`, room),
      onSuccess: refresh,
    }),
    rename: useMutation({
      mutationFn: ({ roomId, changes }: { roomId: number; changes: RoomChanges }) =>
        api.patch<Room>(`/properties/${homeId}/rooms/${roomId}`, changes),
      onSuccess: refresh,
    }),
    remove: useMutation({
      mutationFn: (roomId: number) => api.delete<void>(`/properties/${homeId}/rooms/${roomId}`),
      onSuccess: refresh,
    }),
  };
}
