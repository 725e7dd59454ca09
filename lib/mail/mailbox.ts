import "server-only";
import { readdir, readFile } from "node:fs/promises";
import path from "node:path";
import { serverEnv } from "@/lib/env";

export type MailboxMessage = {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
};

/** Messages the local SMTP catcher stored, newest first (development mailbox page and tests). */
export async function readMailbox(opts: { to?: string; limit?: number } = {}): Promise<MailboxMessage[]> {
  const dir = serverEnv().MAILBOX_DIR;
  let names: string[];
  try {
    names = (await readdir(dir)).filter((n) => n.endsWith(".json"));
  } catch {
    return [];
  }
  names.sort().reverse();
  const out: MailboxMessage[] = [];
  for (const name of names) {
    try {
      const msg = JSON.parse(await readFile(path.join(dir, name), "utf8")) as MailboxMessage;
      if (opts.to && !msg.to.includes(opts.to.toLowerCase())) continue;
      out.push(msg);
      if (opts.limit && out.length >= opts.limit) break;
    } catch {
      // a file being written or removed: skip it
    }
  }
  return out;
}

/** The first http(s) link in a message's text part. */
export function firstLink(text: string): string | null {
  return text.match(/https?:\/\/\S+/)?.[0] ?? null;
}
