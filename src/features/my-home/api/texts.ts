import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api } from "@/lib/api-client";
import type { TextChoiceResponse } from "@/lib/contracts";
import type { TextChoiceInput } from "@/lib/schemas/texts";
import { myHomeKeys } from "@/lib/query-keys";

const key = () => [...myHomeKeys.all, "texts"] as const;

export function useMyTexts() {
  return useQuery({ queryKey: key(), queryFn: ({ signal }) => api.get<TextChoiceResponse>("/me/texts", { signal }) });
}

export function useSaveMyTexts() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: [...key(), "save"],
    mutationFn: (input: TextChoiceInput) => api.put<TextChoiceResponse>("/me/texts", input),
    onSuccess: (saved) => queryClient.setQueryData(key(), saved),
  });
}
