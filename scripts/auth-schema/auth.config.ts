// Used only by `npm run auth:schema` (better-auth's schema generator): the same
// options as lib/auth/auth.ts that shape tables, with no runtime dependencies.
import { betterAuth } from "better-auth";
import { drizzleAdapter } from "better-auth/adapters/drizzle";

export const auth = betterAuth({
  database: drizzleAdapter({} as never, { provider: "sqlite" }),
  emailAndPassword: { enabled: true },
  rateLimit: { enabled: true, storage: "database" },
});
