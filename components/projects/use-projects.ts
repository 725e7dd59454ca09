"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { projectKeys } from "@/lib/client/query-keys";
import type { ProjectDto } from "@/lib/schemas/project";

export function useProjects() {
  return useQuery({
    queryKey: projectKeys.list(),
    queryFn: () => apiFetch<{ projects: ProjectDto[] }>("/api/v1/projects").then((r) => r.projects),
  });
}
