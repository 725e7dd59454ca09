import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, startTestApp, type TestApp } from "../support/app";

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp({ AUTH_RATE_LIMIT_ENABLED: "1", AUTH_RATE_LIMIT_MAX: "6", AUTH_RATE_LIMIT_WINDOW_SEC: "60" });
});
afterAll(async () => app.close());

describe("rate limiting on the auth endpoints", () => {
  it("answers 429 once a client has used up its sign-in attempts", async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++) {
      const res = await call("POST", "/api/auth/sign-in/email", {
        body: { email: "nobody@example.org", password: "wrong password" },
        headers: { "x-forwarded-for": "203.0.113.7" },
      });
      statuses.push(res.status);
    }
    // sign-in allows max/3 = 2 attempts per window
    expect(statuses.slice(0, 2)).toEqual([401, 401]);
    expect(statuses.slice(2)).toEqual([429, 429]);
    // another client is not affected
    const other = await call("POST", "/api/auth/sign-in/email", {
      body: { email: "nobody@example.org", password: "wrong password" },
      headers: { "x-forwarded-for": "203.0.113.8" },
    });
    expect(other.status).toBe(401);
  });
});
