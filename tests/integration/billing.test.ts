/**
 * Export credits and packs: the official Stripe SDK against the local fake Stripe server,
 * its test checkout page (Stripe's documented test cards, REFERENCES.md §7), and webhooks
 * signed the way Stripe signs (HMAC-SHA256 over "{t}.{payload}", REFERENCES.md §7).
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import Stripe from "stripe";
import { call, cookiesFrom, serveRoutes, signUpVerified, startTestApp, waitForMail, type TestApp } from "../support/app";
import { signPayload, startFakeStripe, type FakeStripe } from "@/scripts/fakes/stripe";
import { getBalance, spendCredits } from "@/db/credits";
import { readMailbox } from "@/lib/mail/mailbox";

const SECRET = "whsec_tapernote_test_secret";
let app: TestApp;
let stripeFake: FakeStripe;
let front: Awaited<ReturnType<typeof serveRoutes>>;
const webhooks: { body: string; signature: string }[] = [];
let owner = "";
let editor = "";
let studioId = "";

beforeAll(async () => {
  front = await serveRoutes((method, path, body, headers) => {
    if (path === "/api/stripe/webhook") webhooks.push({ body, signature: headers.get("stripe-signature") ?? "" });
  });
  stripeFake = await startFakeStripe({ port: 0, webhookUrl: `${front.url}/api/stripe/webhook`, webhookSecret: SECRET });
  app = await startTestApp({
    STRIPE_API_HOST: "127.0.0.1",
    STRIPE_API_PORT: String(stripeFake.port),
    STRIPE_API_PROTOCOL: "http",
    STRIPE_WEBHOOK_SECRET: SECRET,
    FREE_MONTHLY_EXPORTS: "5",
  });
  owner = await signUpVerified("hanne@example.org", "Hanne Solberg");
  studioId = (await (await call("GET", "/api/v1/studio", { cookie: owner })).json()).studio.id;
  editor = await signUpVerified("ed@example.org", "Ed");
  await call("POST", "/api/v1/invitations", { cookie: owner, body: { email: "ed@example.org", role: "editor" } });
  const mail = await waitForMail("ed@example.org", "Invitation");
  const token = decodeURIComponent(mail.text.match(/invitations\/(\S+)/)![1]!);
  editor = cookiesFrom(await call("POST", "/api/v1/invitations/accept", { cookie: editor, body: { token } }), editor);
}, 60_000);
afterAll(async () => {
  await app.close();
  await stripeFake.close();
  await front.close();
});

const credits = async () => (await call("GET", "/api/v1/credits", { cookie: owner })).json();
const pay = (url: string, card: string) =>
  fetch(url, { method: "POST", redirect: "manual", headers: { "content-type": "application/x-www-form-urlencoded" }, body: new URLSearchParams({ card, exp: "12 / 34", cvc: "123" }) });

describe("buying an export pack", () => {
  it("starts with the free monthly allowance", async () => {
    expect(await credits()).toMatchObject({ balance: 5, allowanceLeft: 5, purchasedLeft: 0, purchases: [] });
  });

  it("only owners may buy; a bad pack is a field error", async () => {
    expect((await call("POST", "/api/v1/billing/checkout", { cookie: editor, body: { pack: "pack25" } })).status).toBe(403);
    const bad = await call("POST", "/api/v1/billing/checkout", { cookie: owner, body: { pack: "pack7" } });
    expect(bad.status).toBe(422);
    expect((await bad.json()).error.fields.pack).toBeDefined();
  });

  it("a declined card (4000 0000 0000 0002) leaves the balance as it was", async () => {
    const { url } = await (await call("POST", "/api/v1/billing/checkout", { cookie: owner, body: { pack: "pack25" } })).json();
    expect(url).toMatch(new RegExp(`^${stripeFake.url}/checkout/cs_test_`));
    const page = await fetch(url);
    expect(await page.text()).toContain("Card number");
    const declined = await pay(url, "4000 0000 0000 0002");
    expect(declined.status).toBe(402);
    expect(await declined.text()).toContain("Your card was declined.");
    expect(webhooks).toHaveLength(0);
    expect(await credits()).toMatchObject({ balance: 5, purchasedLeft: 0 });
  });

  it("a good card (4242 4242 4242 4242) credits 25 once, by the signed webhook, and e-mails a receipt", async () => {
    const { url, sessionId } = await (await call("POST", "/api/v1/billing/checkout", { cookie: owner, body: { pack: "pack25" } })).json();
    const paid = await pay(url, "4242 4242 4242 4242");
    expect(paid.status).toBe(303);
    expect(paid.headers.get("location")).toContain(`session_id=${sessionId}`);
    expect(webhooks).toHaveLength(1);
    expect(webhooks[0]!.signature).toMatch(/^t=\d+,v1=[0-9a-f]{64}$/);
    const c = await credits();
    expect(c).toMatchObject({ balance: 30, allowanceLeft: 5, purchasedLeft: 25 });
    expect(c.purchases.find((p: { state: string }) => p.state === "paid")).toMatchObject({ credits: 25, amountCents: 900, currency: "eur" });
    const receipt = await waitForMail("hanne@example.org", "receipt");
    expect(receipt.text).toContain("25 export credits");
    expect(receipt.text).toContain("€9.00");
  });

  it("replays, duplicates and late events change nothing", async () => {
    const original = webhooks[0]!;
    // the very same delivery again
    const replay = await call("POST", "/api/stripe/webhook", { rawBody: original.body, headers: { "stripe-signature": original.signature, "content-type": "application/json" } });
    expect(replay.status).toBe(200);
    // a new event id for the same session (Stripe may send an event more than once)
    const dup = { ...JSON.parse(original.body), id: "evt_duplicate_1" };
    const dupBody = JSON.stringify(dup);
    expect((await call("POST", "/api/stripe/webhook", { rawBody: dupBody, headers: { "stripe-signature": signPayload(dupBody, SECRET) } })).status).toBe(200);
    // an expiry arriving after the payment
    const late = { ...dup, id: "evt_late_1", type: "checkout.session.expired", data: { object: { ...dup.data.object, status: "expired" } } };
    const lateBody = JSON.stringify(late);
    expect((await call("POST", "/api/stripe/webhook", { rawBody: lateBody, headers: { "stripe-signature": signPayload(lateBody, SECRET) } })).status).toBe(200);
    const c = await credits();
    expect(c).toMatchObject({ balance: 30, purchasedLeft: 25 });
    expect(c.purchases.find((p: { id: string; state: string }) => p.state === "paid")).toBeDefined();
    expect((await readMailbox({ to: "hanne@example.org" })).filter((m) => m.subject.includes("receipt"))).toHaveLength(1);
  });

  it("a bad signature is 400 and changes nothing", async () => {
    const forged = JSON.stringify({ ...JSON.parse(webhooks[0]!.body), id: "evt_forged" , data: { object: { ...JSON.parse(webhooks[0]!.body).data.object, id: "cs_test_forged" } } });
    const wrongKey = await call("POST", "/api/stripe/webhook", { rawBody: forged, headers: { "stripe-signature": signPayload(forged, "whsec_not_ours") } });
    expect(wrongKey.status).toBe(400);
    const none = await call("POST", "/api/stripe/webhook", { rawBody: forged });
    expect(none.status).toBe(400);
    const tampered = await call("POST", "/api/stripe/webhook", { rawBody: forged.replace("forged", "f0rged"), headers: { "stripe-signature": signPayload(forged, SECRET) } });
    expect(tampered.status).toBe(400);
    expect(await credits()).toMatchObject({ balance: 30 });
  });

  it("the fake signs exactly as the SDK's own test helper does", () => {
    const payload = '{"id":"evt_x"}';
    const t = 1_700_000_000;
    const sdk = new Stripe("sk_test_x").webhooks.generateTestHeaderString({ payload, secret: SECRET, timestamp: t });
    expect(signPayload(payload, SECRET, t)).toBe(sdk);
  });
});

describe("using credits", () => {
  it("50 parallel exports with 10 credits left give exactly 10 files and 40 × no_credits", async () => {
    const other = await signUpVerified("race@example.org", "Race");
    const raceStudio = (await (await call("GET", "/api/v1/studio", { cookie: other })).json()).studio.id;
    // 5 free this month + 5 more used up front would leave 0; instead: spend down to exactly 10 left
    process.env.FREE_MONTHLY_EXPORTS = "10";
    expect((await getBalance(raceStudio)).balance).toBe(10);
    const results = await Promise.allSettled(
      Array.from({ length: 50 }, (_, i) => spendCredits(raceStudio, 1, { userId: "", takeId: "t", detail: `export ${i}` }, () => `file ${i}`)),
    );
    const files = results.filter((r) => r.status === "fulfilled");
    const refused = results.filter((r) => r.status === "rejected");
    expect(files).toHaveLength(10);
    expect(refused).toHaveLength(40);
    for (const r of refused) expect((r as PromiseRejectedResult).reason.code).toBe("no_credits");
    expect(await getBalance(raceStudio)).toMatchObject({ balance: 0, allowanceLeft: 0 });
    process.env.FREE_MONTHLY_EXPORTS = "5";
  });

  it("a failed export uses no credit; the allowance is used before bought credits", async () => {
    const before = await getBalance(studioId);
    await expect(spendCredits(studioId, 1, { userId: "", takeId: "t", detail: "x" }, () => { throw new Error("writer failed"); })).rejects.toThrow("writer failed");
    expect(await getBalance(studioId)).toEqual(before);
    const after = await spendCredits(studioId, 1, { userId: "", takeId: "t", detail: "x" }, () => "ok");
    expect(after.balance).toMatchObject({ allowanceLeft: before.allowanceLeft - 1, purchasedLeft: before.purchasedLeft });
  });

  it("a new month brings a fresh allowance; bought credits carry over", async () => {
    const nextMonth = new Date(Date.UTC(2100, 0, 15));
    const b = await getBalance(studioId, nextMonth);
    expect(b).toMatchObject({ allowanceLeft: 5, purchasedLeft: 25 });
  });
});
