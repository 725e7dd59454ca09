"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { assignmentKeys } from "./keys";
import type { AssignmentInfoDto, AssignmentSource } from "./types";

/** Attaches the expected notes: a MIDI or MusicXML file, or another take's notes. Replaces any earlier assignment. */
export function useSetAssignment(takeId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (source: AssignmentSource) => {
      const path = `/api/v1/takes/${takeId}/assignment`;
      if ("file" in source) {
        const form = new FormData();
        form.set("file", source.file);
        return apiFetch<{ assignment: AssignmentInfoDto }>(path, { method: "PUT", body: form });
      }
      return apiFetch<{ assignment: AssignmentInfoDto }>(path, { method: "PUT", json: source });
    },
    onSuccess: () => queryClient.invalidateQueries({ queryKey: assignmentKeys.detail(takeId) }),
  });
}
