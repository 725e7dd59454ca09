"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { memberKeys } from "@/lib/client/query-keys";
import type { MemberDto } from "@/lib/schemas/members";

export function useMembers() {
  return useQuery({
    queryKey: memberKeys.list(),
    queryFn: () => apiFetch<{ members: MemberDto[] }>("/api/v1/members").then((r) => r.members),
  });
}
