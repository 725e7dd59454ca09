import { sql } from "drizzle-orm";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createClient } from "@libsql/client";
import { call, signIn, startTestApp, type TestApp } from "../support/app";
import { DEMO_ACCOUNTS, DEMO_PASSWORD, DEMO_TAKES, seedDemo, seedDemoTakes } from "@/db/seed";
import { analysis, studio, studioMember, take, user } from "@/db/schema";
import { eq } from "drizzle-orm";

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => app.close());

const n = async (table: typeof user | typeof studioMember | typeof take | typeof analysis) =>
  Number((await app.db.select({ n: sql<number>`count(*)` }).from(table))[0]!.n);

describe("demo seed", () => {
  it("creates the demo studio, accounts and takes once, and again changes nothing", async () => {
    expect((await seedDemo(app.db)).created).toBe(true);
    expect(await seedDemoTakes(app.db)).toBe(DEMO_TAKES.length);
    const counts = [await n(user), await n(studioMember), await n(take), await n(analysis)];
    expect((await seedDemo(app.db)).created).toBe(false);
    expect(await seedDemoTakes(app.db)).toBe(0);
    expect([await n(user), await n(studioMember), await n(take), await n(analysis)]).toEqual(counts);
    expect(counts).toEqual([3, 3, DEMO_TAKES.length, DEMO_TAKES.length]);
  });

  it("every demo account signs in with the documented password and has its role", async () => {
    for (const account of DEMO_ACCOUNTS) {
      const res = await signIn(account.email, DEMO_PASSWORD);
      expect(res.status).toBe(200);
      const cookie = res.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
      const studio = await (await call("GET", "/api/v1/studio", { cookie })).json();
      expect(studio.role).toBe(account.role);
      expect(studio.studio.name).toBe("Linden Row Music School");
    }
  });
});

describe("the file database", () => {
  it("runs in WAL mode with a busy timeout and foreign keys", async () => {
    const c = app.db.$client;
    expect((await c.execute("PRAGMA journal_mode")).rows[0]).toMatchObject({ journal_mode: "wal" });
    // a short busy timeout: busy writes are retried asynchronously (db/client.ts)
    expect(Number(Object.values((await c.execute("PRAGMA busy_timeout")).rows[0]!)[0])).toBeGreaterThan(0);
    expect((await c.execute("PRAGMA foreign_keys")).rows[0]).toMatchObject({ foreign_keys: 1 });
  });
});

describe("writes while another process holds the write lock", () => {
  it("wait without freezing the event loop, then succeed", async () => {
    // a second connection stands in for the job runner's process: it holds the write lock for 400 ms
    const other = createClient({ url: process.env.DATABASE_URL! });
    const tx = await other.transaction("write");
    await tx.execute("UPDATE studio SET name = name");
    const released = new Promise<void>((resolve) => setTimeout(() => void tx.commit().then(resolve), 400));
    let ticks = 0;
    let maxGapMs = 0;
    let last = performance.now();
    const timer = setInterval(() => {
      const now = performance.now();
      maxGapMs = Math.max(maxGapMs, now - last);
      last = now;
      ticks++;
    }, 10);
    const started = performance.now();
    await app.db.insert(studio).values({ id: "busy-test", name: "Waited for the lock" });
    const waitedMs = performance.now() - started;
    clearInterval(timer);
    await released;
    other.close();
    expect(waitedMs).toBeGreaterThan(300);
    expect(ticks).toBeGreaterThan(10);
    expect(maxGapMs).toBeLessThan(150);
    const [row] = await app.db.select().from(studio).where(eq(studio.id, "busy-test"));
    expect(row?.name).toBe("Waited for the lock");
  });

  it("leave every connection fit for later transactions (a busy write must not stay 'in progress')", async () => {
    // Seen under load: after writes met a busy database, a later transaction's COMMIT failed
    // with "cannot commit transaction - SQL statements in progress".
    const other = createClient({ url: process.env.DATABASE_URL! });
    for (let round = 0; round < 3; round++) {
      const tx = await other.transaction("write");
      await tx.execute("UPDATE studio SET name = name");
      const released = new Promise<void>((resolve) => setTimeout(() => void tx.commit().then(resolve), 120));
      // several writers meet the lock at once: plain writes and transactions
      await Promise.all([
        app.db.update(studio).set({ name: `Round ${round}` }).where(eq(studio.id, "busy-test")),
        app.db.transaction(async (t) => {
          await t.update(studio).set({ name: `Round ${round}, in a transaction` }).where(eq(studio.id, "busy-test"));
        }),
        app.db.insert(studio).values({ id: `busy-${round}`, name: "Another" }),
      ]);
      await released;
    }
    other.close();
    // and afterwards, transactions on every pooled connection still commit
    for (let i = 0; i < 8; i++) {
      await app.db.transaction(async (t) => {
        await t.update(studio).set({ name: `After ${i}` }).where(eq(studio.id, "busy-test"));
      });
    }
    const [row] = await app.db.select().from(studio).where(eq(studio.id, "busy-test"));
    expect(row?.name).toBe("After 7");
  });
});
