import type { Metadata } from "next";
import { AccountForms } from "@/components/auth/AccountForms";
import { PageHeader } from "@/components/ui";
import { requirePageActor } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Account" };

export default async function AccountPage() {
  const actor = await requirePageActor("/account");
  return (
    <div className="space-y-6">
      <PageHeader title="Account" description="Your name, your password and your session." />
      <AccountForms name={actor.user.name} email={actor.user.email} />
    </div>
  );
}
