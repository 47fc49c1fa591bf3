export interface PropertyListFilters {
  q: string;
  estate: string;
  page: number;
  pageSize: number;
}

export const propertyKeys = {
  all: ["properties"] as const,
  lists: () => [...propertyKeys.all, "list"] as const,
  list: (filters: PropertyListFilters) => [...propertyKeys.lists(), filters] as const,
  estates: () => [...propertyKeys.all, "estates"] as const,
  details: () => [...propertyKeys.all, "detail"] as const,
  detail: (id: number) => [...propertyKeys.details(), id] as const,
};
