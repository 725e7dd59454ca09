import { afterEach, describe, expect, it } from "vitest";

const saved = { ...process.env };
afterEach(() => {
  process.env = { ...saved };
});

async function freshEnv() {
  const mod = await import("@/lib/env");
  mod.resetServerEnvForTests();
  return mod;
}

describe("server environment", () => {
  it("has development defaults", async () => {
    delete process.env.DATABASE_URL;
    delete process.env.PORT;
    const { serverEnv } = await freshEnv();
    expect(serverEnv().DATABASE_URL).toBe("file:./data/tapernote.db");
    expect(serverEnv().PORT).toBe(3000);
  });

  it("rejects a bad PORT with a readable message", async () => {
    process.env.PORT = "not-a-port";
    const { serverEnv } = await freshEnv();
    expect(() => serverEnv()).toThrow(/PORT/);
  });
});
