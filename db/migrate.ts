import { migrate } from "drizzle-orm/libsql/migrator";
import path from "node:path";
import type { Db } from "./client";

/** Applies drizzle-kit's migrations in ./drizzle (run on start and by tests, never by `build`). */
export async function migrateDb(database: Db): Promise<void> {
  await migrate(database, { migrationsFolder: path.join(process.cwd(), "drizzle") });
}
