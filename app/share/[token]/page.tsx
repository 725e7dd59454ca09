import type { Metadata } from "next";
import Link from "next/link";
import { SharedReplay } from "@/components/replay/SharedReplay";

export const metadata: Metadata = { title: "Shared take", robots: { index: false, follow: false }, referrer: "no-referrer" };

/** A take shared by link: no account, read-only. */
export default async function SharedTakePage({ params }: { params: Promise<{ token: string }> }) {
  const { token } = await params;
  return (
    <div className="min-h-screen">
      <header className="border-b border-rule bg-surface/80">
        <div className="mx-auto flex max-w-6xl items-center gap-4 px-4 py-3">
          <Link href="/" className="text-lg font-semibold tracking-tight">Tapernote</Link>
          <span className="text-sm text-ink-muted">A take shared with you, to replay</span>
        </div>
      </header>
      <main className="mx-auto max-w-6xl px-4 py-8">
        <SharedReplay token={token} />
      </main>
    </div>
  );
}
