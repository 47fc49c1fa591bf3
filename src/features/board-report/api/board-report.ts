import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { api, apiUrl } from "@/lib/api-client";
import type { BoardReportSent, BoardReportSettings } from "@/lib/contracts";
import { boardReportKeys } from "@/lib/query-keys";

/** The address of the month's PDF (a plain download link). */
export const boardReportUrl = (month: string) => apiUrl("/board-report", { month });

export const getBoardReportSettings = (signal?: AbortSignal) =>
  api.get<BoardReportSettings>("/board-report/settings", { signal });

export function useBoardReportSettings(enabled: boolean) {
  return useQuery({ queryKey: boardReportKeys.settings(), queryFn: ({ signal }) => getBoardReportSettings(signal), enabled });
}

export function useSaveBoardReportRecipients() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (recipients: string[]) => api.put<BoardReportSettings>("/board-report/settings", { recipients }),
    onSuccess: (data) => queryClient.setQueryData(boardReportKeys.settings(), data),
  });
}

export function useSendBoardReport() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (month: string) => api.post<BoardReportSent>("/board-report/send", { month }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: boardReportKeys.settings() }),
  });
}
