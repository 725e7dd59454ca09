"use client";
import { useMemo } from "react";
import { useMembers } from "@/components/members/use-members";

/** Who saved a revision: the member's name by user id ("a former member" once they left, "—" for none). */
export function useMemberNames() {
  const members = useMembers();
  return useMemo(() => {
    const byUser = new Map((members.data ?? []).map((m) => [m.userId, m.name || m.email]));
    return (userId: string | null) => (userId === null ? "—" : (byUser.get(userId) ?? (members.data ? "a former member" : "…")));
  }, [members.data]);
}
