"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { projectKeys } from "@/lib/client/query-keys";
import type { ProjectDto, UpdateProjectInput } from "@/lib/schemas/project";

export function useUpdateProject() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, ...input }: UpdateProjectInput & { id: string }) =>
      apiFetch<{ project: ProjectDto }>(`/api/v1/projects/${id}`, { method: "PATCH", json: input }).then((r) => r.project),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.all }),
  });
}
