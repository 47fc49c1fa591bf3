import type { UserResponse, UserStatus } from "@/lib/contracts";

export type { UserStatus };
export type ManagedUser = UserResponse;

export { userStatusLabels } from "@/lib/labels";
