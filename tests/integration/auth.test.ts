import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, cookiesFrom, signIn, signUpVerified, startTestApp, waitForMail, type TestApp } from "../support/app";
import { firstLink } from "@/lib/mail/mailbox";

let app: TestApp;
beforeAll(async () => {
  app = await startTestApp();
});
afterAll(async () => app.close());

describe("sign-up, e-mail verification and sign-in", () => {
  it("cannot sign in before the e-mail address is verified", async () => {
    const res = await call("POST", "/api/auth/sign-up/email", {
      body: { email: "ines@example.org", name: "Ines Varga", password: "correct horse 42" },
    });
    expect(res.status).toBe(200);
    const denied = await signIn("ines@example.org");
    expect(denied.status).toBe(403);
  });

  it("verifies through the link in the caught e-mail, then signs in and out", async () => {
    const cookie = await signUpVerified("marek@example.org", "Marek Sola");
    const me = await call("GET", "/api/v1/me", { cookie });
    expect(me.status).toBe(200);
    const body = await me.json();
    expect(body.user).toMatchObject({ email: "marek@example.org", emailVerified: true });
    expect(JSON.stringify(body)).not.toMatch(/password|token/i);

    // every new account owns a studio of its own
    const studio = await (await call("GET", "/api/v1/studio", { cookie })).json();
    expect(studio.role).toBe("owner");
    expect(studio.studio.name).toBe("Marek Sola's studio");

    const out = await call("POST", "/api/auth/sign-out", { cookie, body: {} });
    expect(out.status).toBe(200);
    const after = await call("GET", "/api/v1/me", { cookie: cookiesFrom(out, cookie) });
    expect(after.status).toBe(401);
  });

  it("resets a forgotten password through the e-mailed link", async () => {
    await signUpVerified("ola@example.org", "Ola Brandt");
    const ask = await call("POST", "/api/auth/request-password-reset", {
      body: { email: "ola@example.org", redirectTo: "/reset-password" },
    });
    expect(ask.status).toBe(200);
    const mail = await waitForMail("ola@example.org", "Reset");
    const link = new URL(firstLink(mail.text)!);
    const follow = await call("GET", link.pathname + link.search);
    expect(follow.status).toBe(302);
    const token = new URL(follow.headers.get("location")!, "http://x").searchParams.get("token")!;
    expect(token).toBeTruthy();
    const reset = await call("POST", "/api/auth/reset-password", { body: { newPassword: "a new tune 77", token } });
    expect(reset.status).toBe(200);
    expect((await signIn("ola@example.org")).status).toBe(401);
    expect((await signIn("ola@example.org", "a new tune 77")).status).toBe(200);
  });

  it("answers signed-out API calls with the JSON error shape", async () => {
    const res = await call("GET", "/api/v1/projects");
    expect(res.status).toBe(401);
    expect(await res.json()).toEqual({ error: { code: "unauthorized", message: "Sign in to continue." } });
  });
});
