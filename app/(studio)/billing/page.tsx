import type { Metadata } from "next";
import { BillingView } from "@/components/billing/BillingView";
import { CreateStudioCard } from "@/components/studio/CreateStudioCard";
import { pageCan, requirePageActor } from "@/lib/auth/page";
import { EXPORT_PACKS } from "@/lib/billing/plans";

export const metadata: Metadata = { title: "Billing" };

export default async function BillingPage({ searchParams }: { searchParams: Promise<Record<string, string | string[] | undefined>> }) {
  const actor = await requirePageActor("/billing");
  if (!actor.studioId) return <CreateStudioCard />;
  const { checkout } = await searchParams;
  const returned = checkout === "success" || checkout === "cancelled" ? checkout : null;
  return <BillingView canBuy={pageCan(actor, "bill")} packs={Object.values(EXPORT_PACKS)} returned={returned} />;
}
