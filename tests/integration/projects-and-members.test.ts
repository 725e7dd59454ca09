import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { sql } from "drizzle-orm";
import { call, cookiesFrom, signUpVerified, startTestApp, waitForMail, type TestApp } from "../support/app";
import { invitation, project } from "@/db/schema";

let app: TestApp;
let owner = "";
beforeAll(async () => {
  app = await startTestApp();
  owner = await signUpVerified("clara@example.org", "Clara Wendt");
});
afterAll(async () => app.close());

const count = async (table: typeof project | typeof invitation) =>
  Number((await app.db.select({ n: sql<number>`count(*)` }).from(table))[0]!.n);

describe("bad API requests get the JSON error shape and change nothing", () => {
  it("422 with a field error for a missing name", async () => {
    const before = await count(project);
    const res = await call("POST", "/api/v1/projects", { cookie: owner, body: { name: "   " } });
    expect(res.status).toBe(422);
    const body = await res.json();
    expect(body.error.code).toBe("validation_failed");
    expect(body.error.fields.name[0]).toMatch(/name/i);
    expect(await count(project)).toBe(before);
  });

  it("400 for malformed JSON, 415 for a body that is not JSON", async () => {
    const bad = await call("POST", "/api/v1/projects", { cookie: owner, rawBody: "{name:", headers: { "content-type": "application/json" } });
    expect(bad.status).toBe(400);
    expect((await bad.json()).error.code).toBe("bad_request");
    const text = await call("POST", "/api/v1/projects", { cookie: owner, rawBody: "name=x", headers: { "content-type": "text/plain" } });
    expect(text.status).toBe(415);
  });

  it("409 with a field error for a duplicate project name, and no second row", async () => {
    expect((await call("POST", "/api/v1/projects", { cookie: owner, body: { name: "Cello studio" } })).status).toBe(201);
    const before = await count(project);
    const dup = await call("POST", "/api/v1/projects", { cookie: owner, body: { name: "Cello studio" } });
    expect(dup.status).toBe(409);
    const body = await dup.json();
    expect(body.error.fields.name).toBeDefined();
    expect(JSON.stringify(body)).not.toMatch(/UNIQUE|sqlite|constraint/i);
    expect(await count(project)).toBe(before);
  });

  it("renames and deletes a project; unknown ids are 404", async () => {
    const { project: p } = await (await call("POST", "/api/v1/projects", { cookie: owner, body: { name: "Viola duets" } })).json();
    const renamed = await call("PATCH", `/api/v1/projects/${p.id}`, { cookie: owner, body: { name: "Viola and cello duets" } });
    expect((await renamed.json()).project.name).toBe("Viola and cello duets");
    expect((await call("PATCH", `/api/v1/projects/${p.id}`, { cookie: owner, body: {} })).status).toBe(422);
    expect((await call("DELETE", `/api/v1/projects/${p.id}`, { cookie: owner })).status).toBe(204);
    expect((await call("GET", `/api/v1/projects/${p.id}`, { cookie: owner })).status).toBe(404);
    expect((await call("DELETE", `/api/v1/projects/${p.id}`, { cookie: owner })).status).toBe(404);
  });

  it("unknown API routes answer 404 in the same shape", async () => {
    const { GET } = await import("@/app/api/v1/[...rest]/route");
    const res = await GET();
    expect(res.status).toBe(404);
    expect((await res.json()).error.code).toBe("not_found");
  });
});

describe("members, roles and invitations", () => {
  let memberCookie = "";
  let memberId = "";

  it("invites by e-mail; accepting joins with the invited role", async () => {
    memberCookie = await signUpVerified("ravi@example.org", "Ravi Anand");
    const res = await call("POST", "/api/v1/invitations", { cookie: owner, body: { email: "Ravi@Example.org", role: "editor" } });
    expect(res.status).toBe(201);
    const mail = await waitForMail("ravi@example.org", "Invitation");
    expect(mail.text).toContain("Clara Wendt");
    const token = decodeURIComponent(mail.text.match(/invitations\/(\S+)/)![1]!);

    const stranger = await signUpVerified("someone@example.org");
    const wrong = await call("POST", "/api/v1/invitations/accept", { cookie: stranger, body: { token } });
    expect(wrong.status).toBe(403);

    const ok = await call("POST", "/api/v1/invitations/accept", { cookie: memberCookie, body: { token } });
    expect(ok.status).toBe(200);
    memberCookie = cookiesFrom(ok, memberCookie);
    const studio = await (await call("GET", "/api/v1/studio", { cookie: memberCookie })).json();
    expect(studio.role).toBe("editor");
    expect(studio.studio.name).toBe("Clara Wendt's studio");
    expect(studio.studios).toHaveLength(2);

    // a used token cannot be used again
    expect((await call("POST", "/api/v1/invitations/accept", { cookie: memberCookie, body: { token } })).status).toBe(404);
    // inviting an existing member is a conflict on the e-mail field
    const again = await call("POST", "/api/v1/invitations", { cookie: owner, body: { email: "ravi@example.org", role: "listener" } });
    expect(again.status).toBe(409);
    expect((await again.json()).error.fields.email).toBeDefined();

    const { members } = await (await call("GET", "/api/v1/members", { cookie: owner })).json();
    memberId = members.find((m: { email: string }) => m.email === "ravi@example.org").id;
  });

  it("a withdrawn invitation no longer works", async () => {
    const res = await call("POST", "/api/v1/invitations", { cookie: owner, body: { email: "late@example.org", role: "listener" } });
    const { invitation: inv } = await res.json();
    const mail = await waitForMail("late@example.org", "Invitation");
    const token = decodeURIComponent(mail.text.match(/invitations\/(\S+)/)![1]!);
    expect((await call("DELETE", `/api/v1/invitations/${inv.id}`, { cookie: owner })).status).toBe(204);
    const late = await signUpVerified("late@example.org");
    expect((await call("POST", "/api/v1/invitations/accept", { cookie: late, body: { token } })).status).toBe(404);
  });

  it("a studio always keeps at least one owner", async () => {
    const { members } = await (await call("GET", "/api/v1/members", { cookie: owner })).json();
    const me = members.find((m: { email: string }) => m.email === "clara@example.org");
    const demote = await call("PATCH", `/api/v1/members/${me.id}`, { cookie: owner, body: { role: "editor" } });
    expect(demote.status).toBe(409);
    expect((await call("DELETE", `/api/v1/members/${me.id}`, { cookie: owner })).status).toBe(409);

    // with a second owner, the first may step down
    expect((await call("PATCH", `/api/v1/members/${memberId}`, { cookie: owner, body: { role: "owner" } })).status).toBe(200);
    expect((await call("PATCH", `/api/v1/members/${me.id}`, { cookie: owner, body: { role: "editor" } })).status).toBe(200);
    // now Clara is an editor and may no longer manage members
    expect((await call("PATCH", `/api/v1/members/${memberId}`, { cookie: owner, body: { role: "listener" } })).status).toBe(403);
    // and the new sole owner cannot demote themself
    expect((await call("PATCH", `/api/v1/members/${memberId}`, { cookie: memberCookie, body: { role: "listener" } })).status).toBe(409);
  });

  it("a bad role is a 422 on the role field", async () => {
    const res = await call("POST", "/api/v1/invitations", { cookie: memberCookie, body: { email: "x@example.org", role: "admin" } });
    expect(res.status).toBe(422);
    expect((await res.json()).error.fields.role).toBeDefined();
  });
});
