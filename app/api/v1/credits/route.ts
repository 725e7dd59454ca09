import { NextResponse } from "next/server";
import { getBalance, listLedger, listPurchases } from "@/db/credits";
import { route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { monthlyAllowance } from "@/lib/billing/plans";

/** Balance (every credit usable now, the allowance left included), purchases and the ledger. */
export const GET = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "read");
  const [balance, purchases, ledger] = await Promise.all([getBalance(actor.studioId), listPurchases(actor.studioId), listLedger(actor.studioId)]);
  return NextResponse.json({
    balance: balance.balance,
    allowanceLeft: balance.allowanceLeft,
    purchasedLeft: balance.purchasedLeft,
    monthlyAllowance: monthlyAllowance(),
    period: balance.period,
    purchases: purchases.map((p) => ({ ...p, createdAt: p.createdAt.toISOString(), paidAt: p.paidAt?.toISOString() })),
    ledger: ledger.map((l) => ({ ...l, createdAt: l.createdAt.toISOString() })),
  });
});
