export const authKeys = {
  all: ["auth"] as const,
  me: () => [...authKeys.all, "me"] as const,
  invitations: () => [...authKeys.all, "invitation"] as const,
  invitation: (token: string) => [...authKeys.invitations(), token] as const,
};
