export const commentKeys = {
  all: ["comments"] as const,
  list: (takeId: string) => [...commentKeys.all, takeId] as const,
};
