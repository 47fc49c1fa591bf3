import type { Role } from "@/lib/roles";

export type UserStatus = "invited" | "active" | "disabled";

export interface ManagedUser {
  id: number;
  email: string;
  name: string;
  role: Role;
  status: UserStatus;
  lastSignInAt: string | null;
  createdAt: string;
}

export const userStatusLabels: Record<UserStatus, string> = {
  invited: "Invited",
  active: "Active",
  disabled: "Disabled",
};
