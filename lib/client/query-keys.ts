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
