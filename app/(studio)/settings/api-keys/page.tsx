import type { Metadata } from "next";
import { ApiKeysView } from "@/components/api-keys/ApiKeysView";
import { CreateStudioCard } from "@/components/studio/CreateStudioCard";
import { pageCan, requirePageActor } from "@/lib/auth/page";

export const metadata: Metadata = { title: "API keys" };

export default async function ApiKeysPage() {
  const actor = await requirePageActor("/settings/api-keys");
  if (!actor.studioId) return <CreateStudioCard />;
  return <ApiKeysView studioName={actor.studioName} canManage={pageCan(actor, "manageApiKeys")} myRole={actor.role} />;
}
