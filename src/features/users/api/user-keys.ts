export interface UserListFilters {
  role: string;
  q: string;
  page: number;
  pageSize: number;
}

export const userKeys = {
  all: ["users"] as const,
  lists: () => [...userKeys.all, "list"] as const,
  list: (filters: UserListFilters) => [...userKeys.lists(), filters] as const,
};
