import { NextResponse } from "next/server";
import { route } from "@/lib/api/respond";
import { handleEvent, verifyEvent } from "@/lib/billing/webhook";

/** Stripe's webhook: the raw body is verified against Stripe-Signature before anything else. */
export const POST = route(async (request) => {
  const payload = await request.text();
  const event = verifyEvent(payload, request.headers.get("stripe-signature"));
  const outcome = await handleEvent(event);
  return NextResponse.json({ received: true, outcome });
});
