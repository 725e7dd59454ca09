/**
 * Local SMTP catcher for development and tests: accepts every message on loopback
 * and stores it as JSON in MAILBOX_DIR, where the /dev/mailbox page reads it.
 * Never used in production (real SMTP is configured there).
 */
import { simpleParser } from "mailparser";
import { SMTPServer } from "smtp-server";
import { mkdirSync, renameSync, writeFileSync } from "node:fs";
import path from "node:path";
import { randomUUID } from "node:crypto";

export type CaughtMail = {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string;
};

export type SmtpCatcher = { port: number; close: () => Promise<void> };

export async function startSmtpCatcher(opts: { port: number; host?: string; dir: string }): Promise<SmtpCatcher> {
  mkdirSync(opts.dir, { recursive: true });
  const server = new SMTPServer({
    authOptional: true,
    disabledCommands: ["STARTTLS", "AUTH"],
    logger: false,
    size: 10 * 1024 * 1024,
    onData(stream, session, callback) {
      simpleParser(stream)
        .then((parsed) => {
          const mail: CaughtMail = {
            id: `${Date.now()}-${randomUUID()}`,
            receivedAt: new Date().toISOString(),
            from: parsed.from?.text ?? "",
            to: session.envelope.rcptTo.map((r) => r.address.toLowerCase()),
            subject: parsed.subject ?? "",
            text: parsed.text ?? "",
            html: typeof parsed.html === "string" ? parsed.html : "",
          };
          const file = path.join(opts.dir, `${mail.id}.json`);
          writeFileSync(`${file}.tmp`, JSON.stringify(mail));
          // rename is atomic, so a reader never sees half a message
          renameSync(`${file}.tmp`, file);
          callback();
        })
        .catch((e: Error) => callback(e));
    },
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, opts.host ?? "127.0.0.1", () => resolve());
  });
  const address = server.server.address();
  const port = typeof address === "object" && address ? address.port : opts.port;
  return { port, close: () => new Promise<void>((resolve) => server.close(() => resolve())) };
}


// Run directly: `tsx scripts/fakes/smtp-catcher.ts` (the run command starts it for you).
if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname)) {
  const port = Number(process.env.SMTP_PORT ?? 2525);
  const dir = process.env.MAILBOX_DIR ?? "./data/mailbox";
  startSmtpCatcher({ port, dir }).then((c) => console.log(`[smtp] catching mail on 127.0.0.1:${c.port} → ${dir}`));
}
