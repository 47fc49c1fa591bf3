/** Roles as the server names them, with the words people see. */
export const ROLES = ["tenant", "officer", "maintenance", "admin"] as const;
export type Role = (typeof ROLES)[number];
export const STAFF_ROLES = ["officer", "maintenance", "admin"] as const satisfies readonly Role[];

export const roleLabels: Record<Role, string> = {
  tenant: "Tenant",
  officer: "Housing officer",
  maintenance: "Maintenance lead",
  admin: "Administrator",
};

export const isRole = (value: string): value is Role => (ROLES as readonly string[]).includes(value);
