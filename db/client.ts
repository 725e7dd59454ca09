import "server-only";
import { createClient, type Client, type InStatement, type Transaction } from "@libsql/client";
import { drizzle, type LibSQLDatabase } from "drizzle-orm/libsql";
import { mkdirSync } from "node:fs";
import path from "node:path";
import * as schema from "./schema";
import { serverEnv } from "@/lib/env";

export type Db = LibSQLDatabase<typeof schema> & { $client: Client };

const WRITE_SQL = /^\s*(insert|update|delete|replace|create|drop|alter|with|pragma\s+\w+\s*=|vacuum|reindex|begin|savepoint)/i;

/**
 * A local libSQL connection waits for SQLite's write lock synchronously. Two connections of
 * one process writing at once would therefore block the event loop while the lock holder
 * (a transaction awaiting on the same loop) cannot finish: a deadlock until the busy timeout.
 * So within a process, writes and transactions take turns through an async lock; reads go
 * straight to the pool (WAL lets them run beside a writer). Other processes (the job runner)
 * wait for the lock in SQLite's busy handler, which works across processes.
 */
/**
 * SQLite's own busy handler waits synchronously, which would freeze this process's event loop
 * while another process (the job runner) holds the write lock. So connections get a short busy
 * timeout and a busy write is retried here, asynchronously, with back-off (about 10 s in all).
 */
const SHORT_BUSY_MS = 25;
async function retryBusy<T>(run: () => Promise<T>): Promise<T> {
  let waitMs = 5;
  for (let spent = 0; ; spent += waitMs, waitMs = Math.min(200, waitMs * 2)) {
    try {
      return await run();
    } catch (e) {
      const code = (e as { code?: string; rawCode?: number }).code ?? "";
      const busy = code === "SQLITE_BUSY" || code.startsWith("SQLITE_BUSY") || (e as { rawCode?: number }).rawCode === 5;
      if (!busy || spent > 10_000) throw e;
      await new Promise((r) => setTimeout(r, waitMs));
    }
  }
}

function serialiseWrites(client: Client): Client {
  let tail: Promise<void> = Promise.resolve();
  const lock = async (): Promise<() => void> => {
    let release!: () => void;
    const mine = new Promise<void>((r) => (release = r));
    const previous = tail;
    tail = previous.then(() => mine);
    await previous;
    let released = false;
    return () => {
      if (!released) {
        released = true;
        release();
      }
    };
  };
  const locked = async <T>(run: () => Promise<T>): Promise<T> => {
    const release = await lock();
    try {
      return await retryBusy(run);
    } finally {
      release();
    }
  };
  const sqlOf = (stmt: InStatement) => (typeof stmt === "string" ? stmt : stmt.sql);
  return new Proxy(client, {
    get(target, prop) {
      if (prop === "execute") {
        return (stmt: InStatement, args?: never) =>
          WRITE_SQL.test(sqlOf(stmt)) ? locked(() => target.execute(stmt as never, args)) : target.execute(stmt as never, args);
      }
      if (prop === "batch" || prop === "migrate" || prop === "executeMultiple") {
        const fn = (target as unknown as Record<string, (...a: unknown[]) => Promise<unknown>>)[prop]!.bind(target);
        return (...a: unknown[]) => locked(() => fn(...a));
      }
      if (prop === "transaction") {
        return async (mode?: "write" | "read" | "deferred") => {
          const release = await lock();
          let tx: Transaction;
          try {
            // BEGIN IMMEDIATE takes the write lock at once, so only the BEGIN can meet a busy database
            tx = await retryBusy(() => target.transaction(mode));
          } catch (e) {
            release();
            throw e;
          }
          return new Proxy(tx, {
            get(t, p) {
              const v = Reflect.get(t, p, t) as unknown;
              if (p === "commit" || p === "rollback") {
                return async () => {
                  try {
                    return await (v as () => Promise<void>).call(t);
                  } finally {
                    release();
                  }
                };
              }
              if (p === "close") {
                return () => {
                  try {
                    (v as () => void).call(t);
                  } finally {
                    release();
                  }
                };
              }
              return typeof v === "function" ? (v as (...a: unknown[]) => unknown).bind(t) : v;
            },
          });
        };
      }
      const value = Reflect.get(target, prop, target) as unknown;
      return typeof value === "function" ? (value as (...a: unknown[]) => unknown).bind(target) : value;
    },
  });
}

/** Opens a Drizzle database on a libSQL client: a `file:` database (WAL, busy timeout) or a libSQL server. */
export function openDb(url: string, authToken?: string): Db {
  if (url.startsWith("file:")) {
    const filePath = url.slice("file:".length);
    if (filePath && filePath !== ":memory:") mkdirSync(path.dirname(filePath), { recursive: true });
  }
  // A short busy timeout on every pooled connection, and async retries of busy writes (above);
  // WAL (set once by migrateDb, it persists in the file) lets readers run while a job writes.
  // libSQL connections enforce foreign keys by default.
  const local = url.startsWith("file:");
  const raw = createClient({ url, authToken, timeout: local ? SHORT_BUSY_MS : 5000 });
  const client = local ? serialiseWrites(raw) : raw;
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
