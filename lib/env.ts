import { z } from "zod";

/**
 * Server configuration, read once from the environment and validated with zod.
 * Development defaults let `npm start` work on a fresh machine; in production the
 * secrets have no defaults and a missing one stops the server at start.
 */
/**
 * APP_ENV, not NODE_ENV, decides whether this is a real deployment: `npm start` on a
 * developer machine runs Next.js's optimised build (NODE_ENV=production) but is still
 * "development" for Tapernote — demo data, local fakes and the mailbox page are on.
 */
const isProduction = process.env.APP_ENV === "production";

const devSecret = "tapernote-development-secret-not-for-production-0123456789";

const envSchema = z.object({
  APP_ENV: z.enum(["development", "test", "production"]).default("development"),
  PORT: z.coerce.number().int().min(1).max(65535).default(3000),
  APP_URL: z.url().optional(),
  DATABASE_URL: z.string().min(1).default("file:./data/tapernote.db"),
  DATABASE_AUTH_TOKEN: z.string().optional(),
  DATA_DIR: z.string().min(1).default("./data/uploads"),
  BETTER_AUTH_SECRET: isProduction
    ? z.string().min(32, "BETTER_AUTH_SECRET must be at least 32 characters in production")
    : z.string().min(32).default(devSecret),
  SMTP_HOST: z.string().default("127.0.0.1"),
  SMTP_PORT: z.coerce.number().int().default(2525),
  SMTP_USER: z.string().optional(),
  SMTP_PASSWORD: z.string().optional(),
  SMTP_SECURE: z
    .enum(["0", "1", "true", "false"])
    .default("0")
    .transform((v) => v === "1" || v === "true"),
  MAIL_FROM: z.string().default("Tapernote <no-reply@tapernote.test>"),
  /** Where the local SMTP catcher keeps the messages it receives (development only). */
  MAILBOX_DIR: z.string().default("./data/mailbox"),
  /** Requests per window on the auth endpoints, per client address. */
  AUTH_RATE_LIMIT_MAX: z.coerce.number().int().min(1).default(30),
  AUTH_RATE_LIMIT_WINDOW_SEC: z.coerce.number().int().min(1).default(60),
  AUTH_RATE_LIMIT_ENABLED: z
    .enum(["0", "1", "true", "false"])
    .default("1")
    .transform((v) => v === "1" || v === "true"),
  REQUIRE_EMAIL_VERIFICATION: z
    .enum(["0", "1", "true", "false"])
    .default("1")
    .transform((v) => v === "1" || v === "true"),
});

export type ServerEnv = z.infer<typeof envSchema>;

let cached: ServerEnv | undefined;

/** The validated server environment; throws one readable message listing every bad variable. */
export function serverEnv(): ServerEnv {
  if (cached) return cached;
  const parsed = envSchema.safeParse(process.env);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => `  ${i.path.join(".")}: ${i.message}`);
    throw new Error(`Tapernote cannot start: bad environment\n${lines.join("\n")}`);
  }
  cached = parsed.data;
  return cached;
}

/** The public origin of the app, e.g. http://localhost:3000. */
export function appUrl(): string {
  const env = serverEnv();
  return env.APP_URL ?? `http://localhost:${env.PORT}`;
}

export function isProductionEnv(): boolean {
  return isProduction;
}

/** Only for tests: forget the cached environment after changing process.env. */
export function resetServerEnvForTests(): void {
  cached = undefined;
}
