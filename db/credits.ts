import "server-only";
import { and, desc, eq, sql } from "drizzle-orm";
import { db, type Db } from "./client";
import { newId } from "./ids";
import { creditLedger, purchase, stripeEvent, user } from "./schema";
import { AppError } from "@/lib/errors";
import { monthlyAllowance, type ExportPack } from "@/lib/billing/plans";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];
type DbOrTx = Db | Tx;

/** The calendar month (UTC) an allowance belongs to, "YYYY-MM". */
export function periodOf(date = new Date()): string {
  return date.toISOString().slice(0, 7);
}

/** The month's free allowance is a ledger row too, written the first time it is needed. */
async function ensureGrant(tx: DbOrTx, studioId: string, period: string): Promise<void> {
  await tx
    .insert(creditLedger)
    .values({ id: newId(), studioId, kind: "grant", amount: monthlyAllowance(), period, pool: "allowance", detail: `Free allowance for ${period}` })
    .onConflictDoNothing();
}

export type Balance = { balance: number; allowanceLeft: number; purchasedLeft: number; period: string };

async function balanceIn(tx: DbOrTx, studioId: string, period: string): Promise<Balance> {
  const [row] = await tx
    .select({
      allowance: sql<number>`coalesce(sum(case when ${creditLedger.pool} = 'allowance' and ${creditLedger.period} = ${period} then ${creditLedger.amount} end), 0)`,
      purchased: sql<number>`coalesce(sum(case when ${creditLedger.pool} = 'purchased' then ${creditLedger.amount} end), 0)`,
    })
    .from(creditLedger)
    .where(eq(creditLedger.studioId, studioId));
  const allowanceLeft = Math.max(0, Number(row?.allowance ?? 0));
  const purchasedLeft = Math.max(0, Number(row?.purchased ?? 0));
  return { balance: allowanceLeft + purchasedLeft, allowanceLeft, purchasedLeft, period };
}

/** Every credit usable now (the allowance left this month included), derived from the ledger. */
export async function getBalance(studioId: string, now = new Date()): Promise<Balance> {
  const period = periodOf(now);
  await ensureGrant(db(), studioId, period);
  return balanceIn(db(), studioId, period);
}

/**
 * Uses `cost` credits for the export that `produce` writes. The file is written first
 * (outside the lock: a large MusicXML can take seconds), then ONE write transaction checks
 * the balance and records the use; only when that commits is the file handed out. So a
 * failed export uses nothing, concurrent exports serialise on the ledger, and the balance
 * can never go below zero. The allowance is used before bought credits. 402 `no_credits`.
 */
export async function spendCredits<T>(
  studioId: string,
  cost: number,
  use: { userId: string; takeId: string; detail: string },
  produce: () => T | Promise<T>,
  now = new Date(),
): Promise<{ result: T; balance: Balance }> {
  const period = periodOf(now);
  const noCredits = () => new AppError("no_credits", "No export credits are left. An owner can buy an export pack on the Billing page.");
  if (cost === 0) return { result: await produce(), balance: await getBalance(studioId, now) };
  // cheap early refusal, so an empty balance costs no export work
  if ((await getBalance(studioId, now)).balance < cost) throw noCredits();
  const result = await produce();
  return db().transaction(
    async (tx) => {
      await ensureGrant(tx, studioId, period);
      const before = await balanceIn(tx, studioId, period);
      if (before.balance < cost) throw noCredits();
      const fromAllowance = Math.min(cost, before.allowanceLeft);
      const fromPurchased = cost - fromAllowance;
      const rows = [
        fromAllowance > 0 && { pool: "allowance" as const, amount: -fromAllowance, period },
        fromPurchased > 0 && { pool: "purchased" as const, amount: -fromPurchased, period: null },
      ].filter(Boolean) as { pool: "allowance" | "purchased"; amount: number; period: string | null }[];
      for (const r of rows) {
        await tx.insert(creditLedger).values({ id: newId(), studioId, kind: "use", takeId: use.takeId, detail: use.detail, createdByUserId: use.userId || null, ...r });
      }
      return { result, balance: await balanceIn(tx, studioId, period) };
    },
    { behavior: "immediate" },
  );
}

export async function createPendingPurchase(studioId: string, pack: ExportPack, userId: string): Promise<string> {
  const id = newId();
  await db().insert(purchase).values({ id, studioId, pack: pack.id, credits: pack.credits, amountCents: pack.priceCents, currency: pack.currency, createdByUserId: userId });
  return id;
}

export async function attachCheckoutSession(purchaseId: string, sessionId: string): Promise<void> {
  await db().update(purchase).set({ stripeSessionId: sessionId }).where(eq(purchase.id, purchaseId));
}

export type CreditedPurchase = { purchaseId: string; studioId: string; credits: number; amountCents: number; currency: string; pack: string; buyerEmail: string | null; buyerName: string | null };

/**
 * Records a Stripe event and, for a paid checkout session, credits its purchase — exactly
 * once: the event id and the purchase's state are checked in the same write transaction,
 * so replays, duplicates and late events change nothing. Returns the purchase when this
 * call credited it (the caller then sends the receipt).
 */
export async function creditPaidSession(event: { id: string; type: string }, session: { id: string; paid: boolean }): Promise<CreditedPurchase | null> {
  return db().transaction(
    async (tx) => {
      const inserted = await tx.insert(stripeEvent).values({ id: event.id, type: event.type }).onConflictDoNothing().returning({ id: stripeEvent.id });
      if (inserted.length === 0 || !session.paid) return null;
      const [p] = await tx
        .select({ id: purchase.id, studioId: purchase.studioId, credits: purchase.credits, state: purchase.state, amountCents: purchase.amountCents, currency: purchase.currency, pack: purchase.pack, email: user.email, name: user.name })
        .from(purchase)
        .leftJoin(user, eq(user.id, purchase.createdByUserId))
        .where(eq(purchase.stripeSessionId, session.id));
      if (!p || p.state === "paid") return null;
      await tx.update(purchase).set({ state: "paid", paidAt: new Date() }).where(and(eq(purchase.id, p.id), eq(purchase.state, "pending")));
      await tx
        .insert(creditLedger)
        .values({ id: newId(), studioId: p.studioId, kind: "purchase", amount: p.credits, pool: "purchased", purchaseId: p.id, detail: `${p.pack}: ${p.credits} credits` })
        .onConflictDoNothing();
      return { purchaseId: p.id, studioId: p.studioId, credits: p.credits, amountCents: p.amountCents, currency: p.currency, pack: p.pack, buyerEmail: p.email, buyerName: p.name };
    },
    { behavior: "immediate" },
  );
}

/** Marks a purchase failed (expired or failed session); never touches a paid one. */
export async function failSession(event: { id: string; type: string }, sessionId: string): Promise<void> {
  await db().transaction(async (tx) => {
    const inserted = await tx.insert(stripeEvent).values({ id: event.id, type: event.type }).onConflictDoNothing().returning({ id: stripeEvent.id });
    if (inserted.length === 0) return;
    await tx.update(purchase).set({ state: "failed" }).where(and(eq(purchase.stripeSessionId, sessionId), eq(purchase.state, "pending")));
  });
}

/** Records an event we do not act on, so a replay is recognised too. */
export async function recordEvent(event: { id: string; type: string }): Promise<void> {
  await db().insert(stripeEvent).values({ id: event.id, type: event.type }).onConflictDoNothing();
}

export type PurchaseRow = { id: string; pack: string; credits: number; amountCents: number; currency: string; state: string; createdAt: Date; paidAt: Date | null };

export async function listPurchases(studioId: string): Promise<PurchaseRow[]> {
  return db()
    .select({ id: purchase.id, pack: purchase.pack, credits: purchase.credits, amountCents: purchase.amountCents, currency: purchase.currency, state: purchase.state, createdAt: purchase.createdAt, paidAt: purchase.paidAt })
    .from(purchase)
    .where(eq(purchase.studioId, studioId))
    .orderBy(desc(purchase.createdAt));
}

export type LedgerRow = { id: string; kind: string; amount: number; pool: string; period: string | null; detail: string; createdAt: Date };

export async function listLedger(studioId: string, limit = 200): Promise<LedgerRow[]> {
  return db()
    .select({ id: creditLedger.id, kind: creditLedger.kind, amount: creditLedger.amount, pool: creditLedger.pool, period: creditLedger.period, detail: creditLedger.detail, createdAt: creditLedger.createdAt })
    .from(creditLedger)
    .where(eq(creditLedger.studioId, studioId))
    .orderBy(desc(creditLedger.createdAt))
    .limit(limit);
}
