// `npm run db:migrate`: applies drizzle/ migrations to DATABASE_URL.
import { openDb } from "@/db/client";
import { migrateDb } from "@/db/migrate";
import { serverEnv } from "@/lib/env";

const env = serverEnv();
const database = openDb(env.DATABASE_URL, env.DATABASE_AUTH_TOKEN);
await migrateDb(database);
console.log(`[db] migrations applied to ${env.DATABASE_URL}`);
database.$client.close();
