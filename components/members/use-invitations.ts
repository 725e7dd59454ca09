"use client";
import { useQuery } from "@tanstack/react-query";
import { apiFetch } from "@/lib/client/api";
import { memberKeys } from "@/lib/client/query-keys";
import type { InvitationDto } from "@/lib/schemas/members";

export function useInvitations(enabled: boolean) {
  return useQuery({
    queryKey: memberKeys.invitations(),
    enabled,
    queryFn: () => apiFetch<{ invitations: InvitationDto[] }>("/api/v1/invitations").then((r) => r.invitations),
  });
}
