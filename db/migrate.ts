import { migrate } from "drizzle-orm/libsql/migrator";
import path from "node:path";
import type { Db } from "./client";

/** Applies drizzle-kit's migrations in ./drizzle (run on start and by tests, never by `build`). */
export async function migrateDb(database: Db): Promise<void> {
  // WAL is a property of the database file: set it once, before the first write.
  const [mode] = (await database.$client.execute("PRAGMA journal_mode")).rows;
  if (mode && String(Object.values(mode)[0]) !== "memory") await database.$client.execute("PRAGMA journal_mode = WAL");
  await migrate(database, { migrationsFolder: path.join(process.cwd(), "drizzle") });
}
