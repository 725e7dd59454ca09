import type { Metadata } from "next";
import Link from "next/link";
import { previewInvitation } from "@/db/studios";
import { AcceptInvitation } from "@/components/studio/AcceptInvitation";
import { Alert, RoleBadge } from "@/components/ui";
import { optionalPageActor } from "@/lib/auth/page";

export const metadata: Metadata = { title: "Invitation" };

export default async function InvitationPage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  const [invitation, actor] = await Promise.all([previewInvitation(token), optionalPageActor()]);
  const here = `/invitations/${encodeURIComponent(token)}`;
  return (
    <div className="flex min-h-screen items-center justify-center px-4">
      <main className="w-full max-w-md space-y-4 rounded-lg border border-rule bg-surface p-6">
        <Link href="/" className="text-lg font-semibold">Tapernote</Link>
        {!invitation || !invitation.usable ? (
          <Alert tone="error" title="This invitation does not work">
            It may have expired or been withdrawn. Ask the studio&apos;s owner for a new one.
          </Alert>
        ) : (
          <>
            <h1 className="text-xl font-semibold">Join {invitation.studioName}</h1>
            <p>
              You are invited as <RoleBadge role={invitation.role} /> for <strong>{invitation.email}</strong>.
            </p>
            {actor ? (
              actor.user.email === invitation.email ? (
                <AcceptInvitation token={token} />
              ) : (
                <Alert tone="error">
                  You are signed in as {actor.user.email}. Sign out and sign in as {invitation.email} to accept.
                </Alert>
              )
            ) : (
              <p className="text-sm">
                <Link href={`/sign-in?next=${encodeURIComponent(here)}`} className="underline underline-offset-2">Sign in</Link> or{" "}
                <Link href="/sign-up" className="underline underline-offset-2">create an account</Link> with {invitation.email}, then open this link again.
              </p>
            )}
          </>
        )}
      </main>
    </div>
  );
}
