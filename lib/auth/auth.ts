import "server-only";
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";
import { nextCookies } from "better-auth/next-js";
import { db } from "@/db/client";
import * as schema from "@/db/schema";
import { createPersonalStudio } from "@/db/studios";
import { appUrl, isProductionEnv, serverEnv } from "@/lib/env";
import { sendMail } from "@/lib/mail/mailer";
import { resetPasswordMail, verifyEmailMail } from "@/lib/mail/templates";

function buildAuth() {
  const env = serverEnv();
  const base = appUrl();
  const origins = new Set([base, `http://localhost:${env.PORT}`, `http://127.0.0.1:${env.PORT}`]);
  return betterAuth({
    appName: "Tapernote",
    baseURL: base,
    secret: env.BETTER_AUTH_SECRET,
    trustedOrigins: [...origins],
    database: drizzleAdapter(db(), { provider: "sqlite", schema }),
    emailAndPassword: {
      enabled: true,
      minPasswordLength: 8,
      maxPasswordLength: 128,
      requireEmailVerification: env.REQUIRE_EMAIL_VERIFICATION,
      revokeSessionsOnPasswordReset: true,
      sendResetPassword: async ({ user, url }) => {
        await sendMail({ to: user.email, ...resetPasswordMail(user.name, url) });
      },
    },
    emailVerification: {
      sendOnSignUp: true,
      sendOnSignIn: true,
      autoSignInAfterVerification: true,
      expiresIn: 60 * 60 * 24,
      sendVerificationEmail: async ({ user, url }) => {
        await sendMail({ to: user.email, ...verifyEmailMail(user.name, url) });
      },
    },
    databaseHooks: {
      user: {
        create: {
          // Every account starts with a studio of its own, so a new teacher can create a project at once.
          after: async (created) => {
            await createPersonalStudio(created.id, created.name);
          },
        },
      },
    },
    rateLimit: {
      enabled: env.AUTH_RATE_LIMIT_ENABLED,
      storage: "database",
      window: env.AUTH_RATE_LIMIT_WINDOW_SEC,
      max: env.AUTH_RATE_LIMIT_MAX,
      customRules: {
        "/sign-in/email": { window: env.AUTH_RATE_LIMIT_WINDOW_SEC, max: Math.max(1, Math.ceil(env.AUTH_RATE_LIMIT_MAX / 3)) },
        "/request-password-reset": { window: env.AUTH_RATE_LIMIT_WINDOW_SEC, max: Math.max(1, Math.ceil(env.AUTH_RATE_LIMIT_MAX / 6)) },
      },
    },
    session: {
      expiresIn: 60 * 60 * 24 * 14,
      updateAge: 60 * 60 * 24,
    },
    advanced: {
      useSecureCookies: isProductionEnv() && base.startsWith("https://"),
      cookiePrefix: "tapernote",
    },
    // nextCookies must stay the last plugin: it sets cookies from server actions.
    plugins: [nextCookies()],
  });
}

export type Auth = ReturnType<typeof buildAuth>;

const globalForAuth = globalThis as unknown as { tapernoteAuth?: Auth };

/** The better-auth instance, built on first use (so `next build` opens no database). */
export function auth(): Auth {
  globalForAuth.tapernoteAuth ??= buildAuth();
  return globalForAuth.tapernoteAuth;
}

/** Only for tests: rebuild after the database or environment changed. */
export function resetAuthForTests(): void {
  globalForAuth.tapernoteAuth = undefined;
}
