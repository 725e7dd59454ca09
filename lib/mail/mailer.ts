import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { serverEnv } from "@/lib/env";

export type OutgoingMail = { to: string; subject: string; text: string; html?: string };

let transporter: Transporter | undefined;

function transport(): Transporter {
  if (!transporter) {
    const env = serverEnv();
    transporter = nodemailer.createTransport({
      host: env.SMTP_HOST,
      port: env.SMTP_PORT,
      secure: env.SMTP_SECURE,
      auth: env.SMTP_USER ? { user: env.SMTP_USER, pass: env.SMTP_PASSWORD ?? "" } : undefined,
      // The local catcher speaks plain SMTP on loopback.
      ignoreTLS: !env.SMTP_SECURE && (env.SMTP_HOST === "127.0.0.1" || env.SMTP_HOST === "localhost"),
    });
  }
  return transporter;
}

/** Sends one message through SMTP (the local catcher in development and tests). */
export async function sendMail(mail: OutgoingMail): Promise<void> {
  await transport().sendMail({ from: serverEnv().MAIL_FROM, ...mail });
}
