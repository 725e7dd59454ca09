import type { Metadata } from "next";
import Link from "next/link";
import { notFound } from "next/navigation";
import { Mono, PageHeader } from "@/components/ui";
import { isProductionEnv } from "@/lib/env";
import { readMailbox } from "@/lib/mail/mailbox";

export const metadata: Metadata = { title: "Development mailbox", robots: { index: false } };
export const dynamic = "force-dynamic";

/** What the local SMTP catcher received. Exists only outside production. */
export default async function MailboxPage() {
  if (isProductionEnv()) notFound();
  const messages = await readMailbox({ limit: 100 });
  return (
    <main className="mx-auto max-w-4xl space-y-6 px-4 py-8">
      <PageHeader
        title="Development mailbox"
        description="Messages Tapernote sent through the local SMTP catcher. This page does not exist in production."
        actions={<Link href="/dev/mailbox" className="text-sm underline underline-offset-2">Refresh</Link>}
      />
      {messages.length === 0 ? (
        <p className="text-ink-muted">No messages yet.</p>
      ) : (
        <ul className="space-y-4">
          {messages.map((m) => (
            <li key={m.id} className="rounded-lg border border-rule bg-surface p-4" data-testid="mail">
              <div className="flex flex-wrap justify-between gap-2 text-sm text-ink-muted">
                <span>To <Mono>{m.to.join(", ")}</Mono></span>
                <Mono>{new Date(m.receivedAt).toLocaleString("en-GB")}</Mono>
              </div>
              <h2 className="mt-1 font-semibold">{m.subject}</h2>
              <pre className="mt-2 whitespace-pre-wrap break-words font-sans text-sm">
                {m.text.split(/(https?:\/\/\S+)/).map((part, i) =>
                  /^https?:\/\//.test(part) ? (
                    <a key={i} href={part} className="text-copper underline underline-offset-2">{part}</a>
                  ) : (
                    <span key={i}>{part}</span>
                  ),
                )}
              </pre>
            </li>
          ))}
        </ul>
      )}
    </main>
  );
}
