import "server-only";
import { createClient, type Client } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import { mkdirSync } from "node:fs";
import path from "node:path";
import * as schema from "./schema";
import { serverEnv } from "@/lib/env";

export type Db = LibSQLDatabase<typeof schema> & { $client: Client };

/** Opens a Drizzle database on a libSQL client: a `file:` database (WAL, busy timeout) or a libSQL server. */
export function openDb(url: string, authToken?: string): Db {
  if (url.startsWith("file:")) {
    const filePath = url.slice("file:".length);
    if (filePath && filePath !== ":memory:") mkdirSync(path.dirname(filePath), { recursive: true });
  }
  // The busy timeout applies to every pooled connection and waits out short write locks;
  // WAL (set once by migrateDb, it persists in the file) lets readers run while a job writes.
  // libSQL connections enforce foreign keys by default.
  const client = createClient({ url, authToken, timeout: 5000 });
  return drizzle(client, { schema }) as Db;
}

const globalForDb = globalThis as unknown as { tapernoteDb?: Db };

/** The process-wide database (one client per process, kept across hot reloads). */
export function db(): Db {
  if (!globalForDb.tapernoteDb) {
    const env = serverEnv();
    globalForDb.tapernoteDb = openDb(env.DATABASE_URL, env.DATABASE_AUTH_TOKEN);
  }
  return globalForDb.tapernoteDb;
}

/** Only for tests: use this database as the process-wide one. */
export function setDbForTests(database: Db | undefined): void {
  globalForDb.tapernoteDb = database;
}
