import "server-only";
import Stripe from "stripe";

/**
 * The official Stripe SDK. With STRIPE_API_HOST/PORT/PROTOCOL set (development and tests)
 * it talks to the local fake Stripe server; with real keys and no override, to Stripe.
 */
export function stripeConfig() {
  const env = process.env;
  return {
    secretKey: env.STRIPE_SECRET_KEY ?? "sk_test_tapernote_local_fake",
    webhookSecret: env.STRIPE_WEBHOOK_SECRET ?? "whsec_tapernote_local_fake_secret",
    host: env.STRIPE_API_HOST ?? (env.STRIPE_SECRET_KEY ? undefined : "127.0.0.1"),
    port: env.STRIPE_API_PORT ?? (env.STRIPE_SECRET_KEY ? undefined : "12111"),
    protocol: (env.STRIPE_API_PROTOCOL ?? (env.STRIPE_SECRET_KEY ? undefined : "http")) as "http" | "https" | undefined,
  };
}

let client: Stripe | undefined;
let clientKey = "";

export function stripe(): Stripe {
  const cfg = stripeConfig();
  const key = JSON.stringify(cfg);
  if (!client || key !== clientKey) {
    client = new Stripe(cfg.secretKey, {
      ...(cfg.host ? { host: cfg.host } : {}),
      ...(cfg.port ? { port: cfg.port } : {}),
      ...(cfg.protocol ? { protocol: cfg.protocol } : {}),
      maxNetworkRetries: 1,
      telemetry: false,
    });
    clientKey = key;
  }
  return client;
}
