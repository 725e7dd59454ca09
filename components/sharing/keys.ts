export const shareLinkKeys = {
  all: ["share-links"] as const,
  list: (takeId: string) => [...shareLinkKeys.all, takeId] as const,
};
