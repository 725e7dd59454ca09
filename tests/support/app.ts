/**
 * Integration-test harness: a temporary database file and mailbox per test file,
 * a real SMTP catcher on a free loopback port, the real better-auth instance, and
 * the real route handlers called with real Request objects.
 */
import { mkdtempSync, rmSync } from "node:fs";
import os from "node:os";
import path from "node:path";
import { openDb, setDbForTests, type Db } from "@/db/client";
import { migrateDb } from "@/db/migrate";
import { resetAuthForTests, auth } from "@/lib/auth/auth";
import { resetServerEnvForTests } from "@/lib/env";
import { readMailbox, firstLink } from "@/lib/mail/mailbox";
import { startSmtpCatcher, type SmtpCatcher } from "@/scripts/fakes/smtp-catcher";

export const BASE = "http://localhost:3999";

type Handler = (request: Request, ctx: { params: Promise<Record<string, string>> }) => Promise<Response>;
type RouteModule = Partial<Record<"GET" | "POST" | "PUT" | "PATCH" | "DELETE", Handler>>;

const routes: [RegExp, string[], () => Promise<RouteModule>][] = [
  [/^\/api\/auth\/.+$/, [], () => import("@/app/api/auth/[...all]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/projects$/, [], () => import("@/app/api/v1/projects/route") as Promise<RouteModule>],
  [/^\/api\/v1\/projects\/([^/]+)$/, ["projectId"], () => import("@/app/api/v1/projects/[projectId]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/studio$/, [], () => import("@/app/api/v1/studio/route") as Promise<RouteModule>],
  [/^\/api\/v1\/studio\/active$/, [], () => import("@/app/api/v1/studio/active/route") as Promise<RouteModule>],
  [/^\/api\/v1\/members$/, [], () => import("@/app/api/v1/members/route") as Promise<RouteModule>],
  [/^\/api\/v1\/members\/([^/]+)$/, ["memberId"], () => import("@/app/api/v1/members/[memberId]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/invitations$/, [], () => import("@/app/api/v1/invitations/route") as Promise<RouteModule>],
  [/^\/api\/v1\/invitations\/accept$/, [], () => import("@/app/api/v1/invitations/accept/route") as Promise<RouteModule>],
  [/^\/api\/v1\/invitations\/([^/]+)$/, ["invitationId"], () => import("@/app/api/v1/invitations/[invitationId]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/me$/, [], () => import("@/app/api/v1/me/route") as Promise<RouteModule>],
  [/^\/api\/v1\/studios$/, [], () => import("@/app/api/v1/studios/route") as Promise<RouteModule>],
  [/^\/api\/v1\/projects\/([^/]+)\/takes$/, ["projectId"], () => import("@/app/api/v1/projects/[projectId]/takes/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/analyses$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/analyses/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/notes$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/notes/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/revisions$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/revisions/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/audio$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/audio/route") as Promise<RouteModule>],
  [/^\/api\/v1\/analyses\/([^/]+)$/, ["analysisId"], () => import("@/app/api/v1/analyses/[analysisId]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/analyses\/([^/]+)\/cancel$/, ["analysisId"], () => import("@/app/api/v1/analyses/[analysisId]/cancel/route") as Promise<RouteModule>],
  [/^\/api\/v1\/api-keys$/, [], () => import("@/app/api/v1/api-keys/route") as Promise<RouteModule>],
  [/^\/api\/v1\/api-keys\/([^/]+)$/, ["keyId"], () => import("@/app/api/v1/api-keys/[keyId]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/limits$/, [], () => import("@/app/api/v1/limits/route") as Promise<RouteModule>],
  [/^\/api\/v1\/openapi\.json$/, [], () => import("@/app/api/v1/openapi.json/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/export$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/export/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/tuning-report$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/tuning-report/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/assignment$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/assignment/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/comments$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/comments/route") as Promise<RouteModule>],
  [/^\/api\/v1\/comments\/([^/]+)$/, ["commentId"], () => import("@/app/api/v1/comments/[commentId]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/takes\/([^/]+)\/share-links$/, ["takeId"], () => import("@/app/api/v1/takes/[takeId]/share-links/route") as Promise<RouteModule>],
  [/^\/api\/v1\/share-links\/([^/]+)$/, ["linkId"], () => import("@/app/api/v1/share-links/[linkId]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/shared\/([^/]+)$/, ["token"], () => import("@/app/api/v1/shared/[token]/route") as Promise<RouteModule>],
  [/^\/api\/v1\/shared\/([^/]+)\/audio$/, ["token"], () => import("@/app/api/v1/shared/[token]/audio/route") as Promise<RouteModule>],
  [/^\/api\/v1\/credits$/, [], () => import("@/app/api/v1/credits/route") as Promise<RouteModule>],
  [/^\/api\/v1\/billing\/checkout$/, [], () => import("@/app/api/v1/billing/checkout/route") as Promise<RouteModule>],
  [/^\/api\/stripe\/webhook$/, [], () => import("@/app/api/stripe/webhook/route") as Promise<RouteModule>],
];

export type TestApp = {
  dir: string;
  db: Db;
  smtp: SmtpCatcher;
  close: () => Promise<void>;
};

export async function startTestApp(env: Record<string, string> = {}): Promise<TestApp> {
  const dir = mkdtempSync(path.join(os.tmpdir(), "tapernote-test-"));
  const mailboxDir = path.join(dir, "mailbox");
  const smtp = await startSmtpCatcher({ port: 0, dir: mailboxDir });
  Object.assign(process.env, {
    DATABASE_URL: `file:${path.join(dir, "test.db")}`,
    DATA_DIR: path.join(dir, "uploads"),
    MAILBOX_DIR: mailboxDir,
    SMTP_HOST: "127.0.0.1",
    SMTP_PORT: String(smtp.port),
    APP_URL: BASE,
    PORT: "3999",
    AUTH_RATE_LIMIT_ENABLED: "0",
    REQUIRE_EMAIL_VERIFICATION: "1",
    ...env,
  });
  resetServerEnvForTests();
  const db = openDb(process.env.DATABASE_URL!);
  await migrateDb(db);
  setDbForTests(db);
  resetAuthForTests();
  return {
    dir,
    db,
    smtp,
    close: async () => {
      await smtp.close();
      db.$client.close();
      setDbForTests(undefined);
      resetAuthForTests();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}

export type CallOptions = { cookie?: string; body?: unknown; headers?: Record<string, string>; rawBody?: string | FormData | Uint8Array };

/** Calls the real route handler for a path, the way Next.js would. */
export async function call(method: string, pathAndQuery: string, opts: CallOptions = {}): Promise<Response> {
  const url = new URL(pathAndQuery, BASE);
  const headers = new Headers(opts.headers);
  headers.set("origin", BASE);
  if (opts.cookie) headers.set("cookie", opts.cookie);
  let body: string | FormData | Uint8Array | undefined;
  if (opts.rawBody !== undefined) body = opts.rawBody;
  else if (opts.body !== undefined) {
    body = JSON.stringify(opts.body);
    if (!headers.has("content-type")) headers.set("content-type", "application/json");
  }
  const request = new Request(url, { method, headers, body: body as BodyInit | undefined });
  for (const [pattern, names, load] of routes) {
    const m = url.pathname.match(pattern);
    if (!m) continue;
    const mod = await load();
    const handler = mod[method as keyof RouteModule];
    if (!handler) return new Response(null, { status: 405 });
    const params: Record<string, string> = {};
    names.forEach((n, i) => (params[n] = decodeURIComponent(m[i + 1]!)));
    return handler(request, { params: Promise.resolve(params) });
  }
  throw new Error(`no route for ${url.pathname}`);
}

/** Turns Set-Cookie headers into a Cookie header value (merging with an earlier one). */
export function cookiesFrom(response: Response, previous = ""): string {
  const jar = new Map<string, string>();
  for (const part of previous.split(";").map((s) => s.trim()).filter(Boolean)) {
    const i = part.indexOf("=");
    jar.set(part.slice(0, i), part.slice(i + 1));
  }
  for (const line of response.headers.getSetCookie()) {
    const [pair] = line.split(";");
    const i = pair!.indexOf("=");
    const name = pair!.slice(0, i).trim();
    const value = pair!.slice(i + 1).trim();
    if (value === "" || /max-age=0/i.test(line)) jar.delete(name);
    else jar.set(name, value);
  }
  return [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
}

export async function waitForMail(to: string, subjectIncludes: string, timeoutMs = 5000) {
  const start = Date.now();
  while (Date.now() - start < timeoutMs) {
    const [mail] = (await readMailbox({ to })).filter((m) => m.subject.includes(subjectIncludes));
    if (mail) return mail;
    await new Promise((r) => setTimeout(r, 25));
  }
  throw new Error(`no mail to ${to} with subject containing "${subjectIncludes}"`);
}

/** Signs up through the real endpoint, follows the verification link from the caught e-mail, returns the session cookie. */
export async function signUpVerified(email: string, name = email.split("@")[0]!, password = "correct horse 42"): Promise<string> {
  const res = await call("POST", "/api/auth/sign-up/email", { body: { email, name, password } });
  if (res.status !== 200) throw new Error(`sign-up failed: ${res.status} ${await res.text()}`);
  const mail = await waitForMail(email, "Confirm");
  const link = firstLink(mail.text)!;
  const verify = await call("GET", new URL(link).pathname + new URL(link).search);
  if (verify.status >= 400) throw new Error(`verify failed: ${verify.status} ${await verify.text()}`);
  const cookie = cookiesFrom(verify);
  if (!cookie.includes("session_token")) throw new Error("verification did not sign in");
  return cookie;
}

export async function signIn(email: string, password = "correct horse 42"): Promise<Response> {
  return call("POST", "/api/auth/sign-in/email", { body: { email, password } });
}

export { auth };

/** A loopback HTTP server in front of the route handlers, for callers that need a URL (the fake Stripe's webhooks). */
export async function serveRoutes(onRequest?: (method: string, path: string, body: string, headers: Headers) => void) {
  const { createServer } = await import("node:http");
  const server = createServer(async (req, res) => {
    const chunks: Buffer[] = [];
    for await (const c of req) chunks.push(c as Buffer);
    const body = Buffer.concat(chunks).toString("utf8");
    const headers: Record<string, string> = {};
    for (const [k, v] of Object.entries(req.headers)) if (typeof v === "string") headers[k] = v;
    onRequest?.(req.method!, req.url!, body, new Headers(headers));
    const response = await call(req.method!, req.url!, { rawBody: body || undefined, headers });
    res.writeHead(response.status, Object.fromEntries(response.headers));
    res.end(Buffer.from(await response.arrayBuffer()));
  });
  await new Promise<void>((r) => server.listen(0, "127.0.0.1", () => r()));
  const port = (server.address() as { port: number }).port;
  return { url: `http://127.0.0.1:${port}`, close: () => new Promise<void>((r) => server.close(() => r())) };
}
