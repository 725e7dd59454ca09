import { takeKeys } from "@/lib/client/query-keys";

/** Query keys of the editor's reads. The revision list's key is the one the export dialog reads too. */
export const editorKeys = {
  revisions: (takeId: string) => [...takeKeys.all, takeId, "revisions"] as const,
  revisionNotes: (takeId: string, revision: number) => [...takeKeys.all, takeId, "revision-notes", revision] as const,
};
