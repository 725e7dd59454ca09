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
 * straight to the pool (WAL lets them run beside a writer).
 *
 * SQLite's own busy handler waits synchronously too, which would freeze the event loop while
 * another process (the job runner) holds the write lock. So the writer's connection does not
 * wait at all (busy timeout 0: every 25 ms it waited held up all the process's requests, seen
 * as note reads' tail latency while jobs wrote), and a busy write is retried here,
 * asynchronously, with back-off (about 10 s in all). Pooled reading connections keep a short
 * busy timeout: in WAL mode they meet a busy database only while a WAL file is being reset.
 *
 * A statement that met SQLITE_BUSY is not reset by the driver: its connection keeps it "in
 * progress" (and can keep a lock) until it is garbage-collected, and a later transaction on that
 * connection fails to COMMIT ("SQL statements in progress"). So writes run on a connection of
 * their own — one at a time, behind the lock — which is closed and opened afresh after a busy
 * error, before the retry; reads never meet a busy database in WAL mode and keep the pool.
 */
const SHORT_BUSY_MS = 25;
const WRITER_BUSY_MS = 0;

function isBusy(e: unknown): boolean {
  const code = (e as { code?: string }).code ?? "";
  return code === "SQLITE_BUSY" || code.startsWith("SQLITE_BUSY") || (e as { rawCode?: number }).rawCode === 5;
}

async function retryBusy<T>(run: () => Promise<T>, afterBusy: () => void = () => undefined): Promise<T> {
  let waitMs = 2;
  for (let spent = 0; ; spent += waitMs, waitMs = Math.min(100, waitMs * 2)) {
    try {
      return await run();
    } catch (e) {
      if (!isBusy(e)) throw e;
      afterBusy();
      if (spent > 10_000) throw e;
      await new Promise((r) => setTimeout(r, waitMs));
    }
  }
}

function serialiseWrites(client: Client, openWriter: () => Client): Client {
  let tail: Promise<void> = Promise.resolve();
  let writer: Client | null = null;
  const currentWriter = () => (writer ??= openWriter());
  // the writer's connection may hold a half-run statement: start again on a fresh one
  const discardWriter = () => {
    const w = writer;
    writer = null;
    if (w === client) return; // an in-memory database's only connection
    try {
      w?.close();
    } catch {
      // already closed
    }
  };
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
  const locked = async <T>(run: (w: Client) => Promise<T>): Promise<T> => {
    const release = await lock();
    try {
      return await retryBusy(() => run(currentWriter()), discardWriter);
    } finally {
      release();
    }
  };
  const sqlOf = (stmt: InStatement) => (typeof stmt === "string" ? stmt : stmt.sql);
  return new Proxy(client, {
    get(target, prop) {
      if (prop === "execute") {
        return (stmt: InStatement, args?: never) =>
          WRITE_SQL.test(sqlOf(stmt)) ? locked((w) => w.execute(stmt as never, args)) : target.execute(stmt as never, args);
      }
      if (prop === "batch" || prop === "migrate" || prop === "executeMultiple") {
        return (...a: unknown[]) =>
          locked((w) => (w as unknown as Record<string, (...b: unknown[]) => Promise<unknown>>)[prop]!(...a));
      }
      if (prop === "close") {
        return () => {
          discardWriter();
          target.close();
        };
      }
      if (prop === "transaction") {
        return async (mode?: "write" | "read" | "deferred") => {
          const release = await lock();
          let tx: Transaction;
          try {
            // BEGIN IMMEDIATE takes the write lock at once, so only the BEGIN can meet a busy database
            tx = await retryBusy(() => currentWriter().transaction(mode), discardWriter);
          } catch (e) {
            release();
            throw e;
          }
          const settle = async (run: () => Promise<void> | void) => {
            try {
              await run();
            } catch (e) {
              if (isBusy(e)) discardWriter();
              throw e;
            } finally {
              release();
            }
          };
          return new Proxy(tx, {
            get(t, p) {
              const v = Reflect.get(t, p, t) as unknown;
              if (p === "commit" || p === "rollback") return () => settle(() => (v as () => Promise<void>).call(t));
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
  // an in-memory database exists on one connection only: its writes cannot move to another
  const inMemory = /^file::memory:|^file:$|^:memory:/.test(url);
  const openWriter = inMemory ? () => raw : () => createClient({ url, authToken, timeout: WRITER_BUSY_MS, concurrency: 1 });
  const client = local ? serialiseWrites(raw, openWriter) : raw;
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
