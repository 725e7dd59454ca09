/** TanStack Query key factories, one per entity. */
export const projectKeys = {
  all: ["projects"] as const,
  list: () => [...projectKeys.all, "list"] as const,
  detail: (id: string) => [...projectKeys.all, "detail", id] as const,
};
export const memberKeys = {
  all: ["members"] as const,
  list: () => [...memberKeys.all, "list"] as const,
  invitations: () => [...memberKeys.all, "invitations"] as const,
};
export const studioKeys = { current: ["studio", "current"] as const };
export const takeKeys = {
  all: ["takes"] as const,
  list: (projectId: string) => [...takeKeys.all, "list", projectId] as const,
  detail: (takeId: string) => [...takeKeys.all, "detail", takeId] as const,
  analyses: (takeId: string) => [...takeKeys.all, "analyses", takeId] as const,
  notes: (takeId: string) => [...takeKeys.all, "notes", takeId] as const,
};
export const limitsKeys = { current: ["limits"] as const };
export const apiKeyKeys = {
  all: ["api-keys"] as const,
  list: () => [...apiKeyKeys.all, "list"] as const,
};
