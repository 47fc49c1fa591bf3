import type { UserResponse, UserStatus } from "@/lib/contracts";

export type { UserStatus };
export type ManagedUser = UserResponse;

export const userStatusLabels: Record<UserStatus, string> = {
  invited: "Invited",
  active: "Active",
  disabled: "Disabled",
  cancelled: "Invitation cancelled",
};
