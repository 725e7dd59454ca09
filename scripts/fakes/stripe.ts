/**
 * Local fake of the Stripe API, for development and tests: the official `stripe` SDK is
 * pointed at it (host/port/protocol). It implements the calls Tapernote makes —
 * create and retrieve a Checkout Session — serves a stand-in for the hosted checkout page
 * where a test card number is typed (Stripe's documented test cards: 4242 4242 4242 4242
 * succeeds, 4000 0000 0000 0002 is declined), and then sends `checkout.session.completed`
 * to the app's webhook, signed the way Stripe signs: header `Stripe-Signature: t=…,v1=…`,
 * HMAC-SHA256 over "{t}.{payload}" with the endpoint secret.
 */
import { createHmac, randomBytes } from "node:crypto";
import { createServer, type IncomingMessage, type Server, type ServerResponse } from "node:http";
import path from "node:path";

export type FakeStripeOptions = { port: number; host?: string; webhookUrl: string; webhookSecret: string; secretKey?: string };
export type FakeStripe = { port: number; url: string; close: () => Promise<void>; sessions: Map<string, Session> };

type Session = {
  id: string;
  object: "checkout.session";
  mode: string;
  status: "open" | "complete" | "expired";
  payment_status: "unpaid" | "paid";
  amount_total: number;
  currency: string;
  metadata: Record<string, string>;
  client_reference_id: string | null;
  customer_email: string | null;
  success_url: string;
  cancel_url: string;
  url: string;
  created: number;
  livemode: false;
  line_items_summary: { name: string; quantity: number; unit_amount: number }[];
};

const id = (prefix: string) => `${prefix}_${randomBytes(12).toString("hex")}`;

/** Stripe's form encoding (a[b][0][c]=v) → nested objects and arrays. */
export function parseStripeForm(body: string): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [rawKey, value] of new URLSearchParams(body)) {
    const keys = rawKey.replace(/\]/g, "").split("[");
    let node: Record<string, unknown> = out;
    keys.forEach((k, i) => {
      if (i === keys.length - 1) node[k] = value;
      else node = (node[k] ??= /^\d+$/.test(keys[i + 1]!) ? [] : {}) as Record<string, unknown>;
    });
  }
  return out;
}

/** The signature header Stripe puts on a webhook request. */
export function signPayload(payload: string, secret: string, timestampSec = Math.floor(Date.now() / 1000)): string {
  const v1 = createHmac("sha256", secret).update(`${timestampSec}.${payload}`).digest("hex");
  return `t=${timestampSec},v1=${v1}`;
}

function readBody(req: IncomingMessage): Promise<string> {
  return new Promise((resolve, reject) => {
    let data = "";
    req.setEncoding("utf8");
    req.on("data", (c) => {
      data += c;
      if (data.length > 1_000_000) req.destroy();
    });
    req.on("end", () => resolve(data));
    req.on("error", reject);
  });
}

function json(res: ServerResponse, status: number, body: unknown) {
  res.writeHead(status, { "content-type": "application/json" });
  res.end(JSON.stringify(body));
}

function escapeHtml(s: string) {
  return s.replace(/[&<>"']/g, (c) => ({ "&": "&amp;", "<": "&lt;", ">": "&gt;", '"': "&quot;", "'": "&#39;" })[c]!);
}

function checkoutPage(s: Session, message?: { tone: "error" | "info"; text: string }) {
  const total = new Intl.NumberFormat("en-GB", { style: "currency", currency: s.currency.toUpperCase() }).format(s.amount_total / 100);
  const items = s.line_items_summary.map((i) => `<li>${escapeHtml(i.name)} × ${i.quantity}</li>`).join("");
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><title>Test checkout</title>
<style>body{font-family:sans-serif;background:#f4f4f6;color:#222;display:flex;justify-content:center;padding:48px 16px}
main{background:#fff;border-radius:8px;padding:28px;max-width:420px;width:100%;box-shadow:0 1px 4px #0002}
label{display:block;margin:14px 0 4px;font-size:14px}input{width:100%;box-sizing:border-box;padding:9px;font-size:16px;border:1px solid #bbb;border-radius:4px}
button{margin-top:20px;width:100%;padding:11px;font-size:16px;background:#444;color:#fff;border:0;border-radius:4px}
.note{font-size:13px;color:#555}.error{color:#a00;background:#fee;padding:8px;border-radius:4px}.total{font-size:22px;margin:8px 0}</style></head>
<body><main><p class="note">Local test checkout — a stand-in for the payment provider's hosted page. No real payment is taken.</p>
<ul>${items}</ul><p class="total">${total}</p>
${message ? `<p class="${message.tone}" role="alert">${escapeHtml(message.text)}</p>` : ""}
${s.status === "open" ? `<form method="post" action="/checkout/${s.id}">
<label for="card">Card number</label><input id="card" name="card" inputmode="numeric" autocomplete="off" placeholder="4242 4242 4242 4242">
<label for="exp">Expiry (MM / YY)</label><input id="exp" name="exp" value="12 / 34">
<label for="cvc">CVC</label><input id="cvc" name="cvc" value="123">
<button type="submit">Pay ${total}</button></form>
<p class="note">Test cards: 4242 4242 4242 4242 succeeds; 4000 0000 0000 0002 is declined.</p>
<p><a href="${escapeHtml(s.cancel_url)}">Cancel and go back</a></p>` : `<p>This checkout is ${s.status}.</p>`}
</main></body></html>`;
}

export async function startFakeStripe(opts: FakeStripeOptions): Promise<FakeStripe> {
  const sessions = new Map<string, Session>();
  let base = "";

  async function deliver(event: unknown, attempt = 0): Promise<void> {
    const payload = JSON.stringify(event);
    try {
      const res = await fetch(opts.webhookUrl, {
        method: "POST",
        headers: { "content-type": "application/json", "stripe-signature": signPayload(payload, opts.webhookSecret) },
        body: payload,
      });
      if (res.status >= 500 && attempt < 4) throw new Error(`webhook answered ${res.status}`);
    } catch (e) {
      // Stripe retries failed deliveries; so does the fake, a few times with back-off
      if (attempt < 4) {
        await new Promise((r) => setTimeout(r, 500 * 2 ** attempt));
        return deliver(event, attempt + 1);
      }
      console.error("[fake-stripe] webhook delivery failed:", (e as Error).message);
    }
  }

  function event(type: string, object: unknown) {
    return { id: id("evt"), object: "event", api_version: "2025-01-01", created: Math.floor(Date.now() / 1000), livemode: false, type, data: { object } };
  }

  const server: Server = createServer(async (req, res) => {
    try {
      const url = new URL(req.url ?? "/", base);
      if (url.pathname.startsWith("/v1/")) {
        const auth = req.headers.authorization ?? "";
        if (!/^Bearer sk_test_/.test(auth) || (opts.secretKey && auth !== `Bearer ${opts.secretKey}`)) {
          return json(res, 401, { error: { type: "invalid_request_error", message: "Invalid API Key provided." } });
        }
      }
      if (req.method === "POST" && url.pathname === "/v1/checkout/sessions") {
        const p = parseStripeForm(await readBody(req)) as Record<string, any>;
        const items = ((p.line_items as any[]) ?? []).map((li) => ({
          name: li.price_data?.product_data?.name ?? "Item",
          quantity: Number(li.quantity ?? 1),
          unit_amount: Number(li.price_data?.unit_amount ?? 0),
          currency: li.price_data?.currency ?? "eur",
        }));
        if (p.mode !== "payment" || items.length === 0 || !p.success_url) {
          return json(res, 400, { error: { type: "invalid_request_error", message: "mode=payment, line_items and success_url are required." } });
        }
        const sid = `cs_test_${randomBytes(16).toString("hex")}`;
        const session: Session = {
          id: sid,
          object: "checkout.session",
          mode: "payment",
          status: "open",
          payment_status: "unpaid",
          amount_total: items.reduce((s, i) => s + i.unit_amount * i.quantity, 0),
          currency: items[0]!.currency,
          metadata: (p.metadata as Record<string, string>) ?? {},
          client_reference_id: (p.client_reference_id as string) ?? null,
          customer_email: (p.customer_email as string) ?? null,
          success_url: String(p.success_url),
          cancel_url: String(p.cancel_url ?? p.success_url),
          url: `${base}/checkout/${sid}`,
          created: Math.floor(Date.now() / 1000),
          livemode: false,
          line_items_summary: items,
        };
        sessions.set(sid, session);
        return json(res, 200, session);
      }
      const retrieve = url.pathname.match(/^\/v1\/checkout\/sessions\/(cs_test_[0-9a-f]+)$/);
      if (req.method === "GET" && retrieve) {
        const s = sessions.get(retrieve[1]!);
        return s ? json(res, 200, s) : json(res, 404, { error: { type: "invalid_request_error", message: "No such checkout.session" } });
      }
      const page = url.pathname.match(/^\/checkout\/(cs_test_[0-9a-f]+)$/);
      if (page) {
        const s = sessions.get(page[1]!);
        if (!s) {
          res.writeHead(404, { "content-type": "text/html" });
          return res.end("<p>This checkout does not exist.</p>");
        }
        if (req.method === "GET") {
          res.writeHead(200, { "content-type": "text/html; charset=utf-8" });
          return res.end(checkoutPage(s));
        }
        if (req.method === "POST") {
          const form = new URLSearchParams(await readBody(req));
          const card = (form.get("card") ?? "").replace(/\D/g, "");
          if (s.status !== "open") {
            res.writeHead(409, { "content-type": "text/html; charset=utf-8" });
            return res.end(checkoutPage(s));
          }
          if (card === "4242424242424242") {
            s.status = "complete";
            s.payment_status = "paid";
            await deliver(event("checkout.session.completed", s));
            res.writeHead(303, { location: s.success_url.replace("{CHECKOUT_SESSION_ID}", s.id) });
            return res.end();
          }
          const text =
            card === "4000000000000002"
              ? "Your card was declined."
              : "Your card was declined. This is a test checkout: use a test card number.";
          res.writeHead(402, { "content-type": "text/html; charset=utf-8" });
          return res.end(checkoutPage(s, { tone: "error", text }));
        }
      }
      json(res, 404, { error: { type: "invalid_request_error", message: `Unrecognized request URL (${req.method}: ${url.pathname}).` } });
    } catch (e) {
      json(res, 500, { error: { type: "api_error", message: (e as Error).message } });
    }
  });
  await new Promise<void>((resolve, reject) => {
    server.once("error", reject);
    server.listen(opts.port, opts.host ?? "127.0.0.1", () => resolve());
  });
  const port = (server.address() as { port: number }).port;
  base = `http://127.0.0.1:${port}`;
  return { port, url: base, sessions, close: () => new Promise<void>((r) => server.close(() => r())) };
}

// Run directly: `tsx scripts/fakes/stripe.ts` (the run command starts it for you).
if (process.argv[1] && path.resolve(process.argv[1]) === path.resolve(new URL(import.meta.url).pathname)) {
  const port = Number(process.env.STRIPE_API_PORT ?? 12111);
  const app = process.env.APP_URL ?? `http://localhost:${process.env.PORT ?? 3000}`;
  startFakeStripe({ port, webhookUrl: `${app}/api/stripe/webhook`, webhookSecret: process.env.STRIPE_WEBHOOK_SECRET ?? "whsec_tapernote_local_fake_secret" }).then((f) =>
    console.log(`[fake-stripe] on ${f.url}, webhooks to ${app}/api/stripe/webhook`),
  );
}
