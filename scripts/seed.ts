// `npm run db:seed`: the demo studio and accounts (refuses in production).
import { openDb } from "@/db/client";
import { migrateDb } from "@/db/migrate";
import { seedDemo, seedDemoTakes } from "@/db/seed";
import { isProductionEnv, serverEnv } from "@/lib/env";

if (isProductionEnv()) {
  console.error("[seed] refusing to seed demo data with APP_ENV=production");
  process.exit(1);
}
const env = serverEnv();
const database = openDb(env.DATABASE_URL, env.DATABASE_AUTH_TOKEN);
await migrateDb(database);
const { created } = await seedDemo(database);
console.log(created ? "[seed] demo studio seeded" : "[seed] demo studio already present");
const takes = await seedDemoTakes(database);
if (takes) console.log(`[seed] ${takes} demo takes added; the job runner analyses them`);
database.$client.close();
