import { takeKeys } from "@/lib/client/query-keys";

/** Query keys of the tuning report and the notes with pitch curves (under the take's notes key, so a new analysis refreshes them). */
export const reportKeys = {
  report: (takeId: string, referenceHz: number | null) => [...takeKeys.notes(takeId), "tuning-report", referenceHz ?? "take"] as const,
  curves: (takeId: string) => [...takeKeys.notes(takeId), "curves"] as const,
};
