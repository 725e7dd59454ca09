"use client";
import { useMutation, useQueryClient } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { projectKeys } from "@/lib/client/query-keys";
import type { CreateProjectInput, ProjectDto } from "@/lib/schemas/project";

export function useCreateProject() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: CreateProjectInput) =>
      apiFetch<{ project: ProjectDto }>("/api/v1/projects", { method: "POST", json: input }).then((r) => r.project),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.all }),
  });
}
