import type { Metadata } from "next";
import { MembersView } from "@/components/members/MembersView";
import { CreateStudioCard } from "@/components/studio/CreateStudioCard";
import { pageCan, requirePageActor } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Members" };

export default async function MembersPage() {
  const actor = await requirePageActor("/members");
  if (!actor.studioId) return <CreateStudioCard />;
  return <MembersView canManage={pageCan(actor, "manageMembers")} myUserId={actor.user.id} studioName={actor.studioName} />;
}
