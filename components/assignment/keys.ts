export const assignmentKeys = {
  all: ["assignment"] as const,
  detail: (takeId: string) => [...assignmentKeys.all, takeId] as const,
};
