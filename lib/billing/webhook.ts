import "server-only";
import type Stripe from "stripe";
import { creditPaidSession, failSession, recordEvent } from "@/db/credits";
import { AppError } from "@/lib/errors";
import { sendMail } from "@/lib/mail/mailer";
import { receiptMail } from "@/lib/mail/templates";
import { formatPrice } from "./plans";
import { stripe, stripeConfig } from "./stripe";

/** Verifies a webhook's Stripe-Signature with the endpoint secret (the SDK's constructEvent). */
export function verifyEvent(payload: string, signature: string | null): Stripe.Event {
  if (!signature) throw new AppError("bad_request", "Missing Stripe-Signature header.");
  try {
    return stripe().webhooks.constructEvent(payload, signature, stripeConfig().webhookSecret);
  } catch {
    throw new AppError("bad_request", "The webhook signature does not verify.");
  }
}

/** Acts on one verified event; idempotent on the event id and the checkout session. */
export async function handleEvent(event: Stripe.Event): Promise<"credited" | "ignored"> {
  switch (event.type) {
    case "checkout.session.completed":
    case "checkout.session.async_payment_succeeded": {
      const session = event.data.object as Stripe.Checkout.Session;
      const credited = await creditPaidSession(event, { id: session.id, paid: session.payment_status === "paid" });
      if (!credited) return "ignored";
      if (credited.buyerEmail) {
        await sendMail({
          to: credited.buyerEmail,
          ...receiptMail(credited.buyerName ?? "", credited.credits, formatPrice(credited.amountCents, credited.currency), session.id),
        }).catch((e) => console.error("[billing] receipt e-mail failed", e));
      }
      return "credited";
    }
    case "checkout.session.expired":
    case "checkout.session.async_payment_failed": {
      await failSession(event, (event.data.object as Stripe.Checkout.Session).id);
      return "ignored";
    }
    default:
      await recordEvent(event);
      return "ignored";
  }
}
