import { NextResponse } from "next/server";
import { z } from "zod";
import { attachCheckoutSession, createPendingPurchase } from "@/db/credits";
import { parseJson, route } from "@/lib/api/respond";
import { requireActor, requireRole } from "@/lib/auth/actor";
import { EXPORT_PACKS, PACK_IDS } from "@/lib/billing/plans";
import { stripe } from "@/lib/billing/stripe";
import { appUrl } from "@/lib/env";
import { AppError } from "@/lib/errors";

/** Owners buy export packs: a Stripe Checkout Session (mode payment); credited by the webhook. */
export const POST = route(async (request) => {
  const actor = await requireActor(request);
  requireRole(actor, "bill");
  const { pack: packId } = await parseJson(request, z.object({ pack: z.enum(PACK_IDS as [string, ...string[]], { error: "Choose an export pack." }) }));
  const pack = EXPORT_PACKS[packId as keyof typeof EXPORT_PACKS];
  const purchaseId = await createPendingPurchase(actor.studioId, pack, actor.user.id);
  let session;
  try {
    session = await stripe().checkout.sessions.create({
      mode: "payment",
      line_items: [{ quantity: 1, price_data: { currency: pack.currency, unit_amount: pack.priceCents, product_data: { name: `Tapernote ${pack.name}` } } }],
      client_reference_id: actor.studioId,
      customer_email: actor.user.email || undefined,
      metadata: { studioId: actor.studioId, purchaseId, pack: pack.id },
      success_url: `${appUrl()}/billing?checkout=success&session_id={CHECKOUT_SESSION_ID}`,
      cancel_url: `${appUrl()}/billing?checkout=cancelled`,
    });
  } catch (e) {
    console.error("[billing] checkout session failed", e);
    throw new AppError("internal", "The payment page could not be opened. Try again in a moment.");
  }
  await attachCheckoutSession(purchaseId, session.id);
  return NextResponse.json({ url: session.url, sessionId: session.id });
});
