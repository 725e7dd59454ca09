/**
 * The access-control matrix: every protected operation × every kind of caller,
 * asserting the exact status. A cell left out of MATRIX fails the completeness test.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { call, signUpVerified, startTestApp, type TestApp } from "../support/app";
import { toneWav, uploadForm } from "../support/audio";

const PRINCIPALS = ["signedOut", "outsider", "listener", "editor", "owner"] as const;
type Principal = (typeof PRINCIPALS)[number];

let app: TestApp;
const cookies: Partial<Record<Principal, string>> = {};
let studioId = "";
let seq = 0;

async function json(res: Response) {
  return res.status === 204 ? null : res.json();
}

async function asOwner(method: string, path: string, body?: unknown) {
  const res = await call(method, path, { cookie: cookies.owner, body });
  if (res.status >= 300) throw new Error(`setup ${method} ${path}: ${res.status} ${await res.text()}`);
  return json(res);
}

async function newProject(): Promise<string> {
  const { project } = await asOwner("POST", "/api/v1/projects", { name: `Matrix project ${++seq}` });
  return project.id;
}

/** A fresh non-owner member of the studio (so removing or re-roling it is always legal). */
async function newMember(): Promise<string> {
  const email = `member${++seq}@example.net`;
  const cookie = await signUpVerified(email);
  await asOwner("POST", "/api/v1/invitations", { email, role: "listener" });
  const { readMailbox } = await import("@/lib/mail/mailbox");
  const [mail] = (await readMailbox({ to: email })).filter((m) => m.subject.startsWith("Invitation"));
  const token = decodeURIComponent(mail!.text.match(/invitations\/(\S+)/)![1]!);
  const res = await call("POST", "/api/v1/invitations/accept", { cookie, body: { token } });
  if (res.status !== 200) throw new Error(`accept: ${res.status}`);
  const { members } = await asOwner("GET", "/api/v1/members");
  return members.find((m: { email: string }) => m.email === email).id;
}

async function newInvitation(): Promise<string> {
  const { invitation } = await asOwner("POST", "/api/v1/invitations", { email: `invitee${++seq}@example.net`, role: "editor" });
  return invitation.id;
}

let takeProject = "";
let sourceTake = "";
const wav = toneWav({ freqsHz: [261.63], durationSec: 0.5 });

async function newTake(): Promise<string> {
  const res = await call("POST", `/api/v1/projects/${takeProject}/takes`, { cookie: cookies.owner, rawBody: uploadForm({ file: wav }) });
  if (res.status !== 201) throw new Error(`setup upload: ${res.status} ${await res.text()}`);
  return (await res.json()).take.id;
}

/** A take with revision 1 saved, so it has notes without waiting for an analysis. */
async function takeWithNotes(): Promise<string> {
  const id = await newTake();
  await asOwner("PUT", `/api/v1/takes/${id}/notes`, { baseRevision: 0, notes: [{ onsetSec: 0, offsetSec: 0.4, pitch: 60, cents: 0, velocity: 80, voice: 1 }] });
  return id;
}

async function newAnalysis(): Promise<string> {
  const id = await newTake();
  const { analyses } = await asOwner("GET", `/api/v1/takes/${id}/analyses`);
  return analyses[0].id;
}

async function newApiKey(): Promise<string> {
  const { apiKey } = await asOwner("POST", "/api/v1/api-keys", { name: `Key ${++seq}`, role: "listener" });
  return apiKey.id;
}

type Op = { method: string; path: () => Promise<string> | string; body?: () => unknown };

const OPS: Record<string, Op> = {
  "list projects": { method: "GET", path: () => "/api/v1/projects" },
  "create project": { method: "POST", path: () => "/api/v1/projects", body: () => ({ name: `Created ${++seq}` }) },
  "read project": { method: "GET", path: async () => `/api/v1/projects/${await newProject()}` },
  "rename project": { method: "PATCH", path: async () => `/api/v1/projects/${await newProject()}`, body: () => ({ name: `Renamed ${++seq}` }) },
  "delete project": { method: "DELETE", path: async () => `/api/v1/projects/${await newProject()}` },
  "read studio": { method: "GET", path: () => "/api/v1/studio" },
  "rename studio": { method: "PATCH", path: () => "/api/v1/studio", body: () => ({ name: "Harbour Lane Music" }) },
  "switch to studio": { method: "PUT", path: () => "/api/v1/studio/active", body: () => ({ studioId }) },
  "list members": { method: "GET", path: () => "/api/v1/members" },
  "change member role": { method: "PATCH", path: async () => `/api/v1/members/${await newMember()}`, body: () => ({ role: "editor" }) },
  "remove member": { method: "DELETE", path: async () => `/api/v1/members/${await newMember()}` },
  "list invitations": { method: "GET", path: () => "/api/v1/invitations" },
  "invite": { method: "POST", path: () => "/api/v1/invitations", body: () => ({ email: `new${++seq}@example.net`, role: "listener" }) },
  "revoke invitation": { method: "DELETE", path: async () => `/api/v1/invitations/${await newInvitation()}` },
  "list takes": { method: "GET", path: () => `/api/v1/projects/${takeProject}/takes` },
  "upload take": { method: "POST", path: () => `/api/v1/projects/${takeProject}/takes`, body: () => uploadForm({ file: wav }) },
  "read take": { method: "GET", path: async () => `/api/v1/takes/${await newTake()}` },
  "play take audio": { method: "GET", path: async () => `/api/v1/takes/${await newTake()}/audio` },
  "delete take": { method: "DELETE", path: async () => `/api/v1/takes/${await newTake()}` },
  "list analyses": { method: "GET", path: async () => `/api/v1/takes/${await newTake()}/analyses` },
  "re-analyse take": { method: "POST", path: async () => `/api/v1/takes/${await newTake()}/analyses`, body: () => ({ settings: { taper: "hamming" } }) },
  "read analysis": { method: "GET", path: async () => `/api/v1/analyses/${await newAnalysis()}` },
  "cancel analysis": { method: "POST", path: async () => `/api/v1/analyses/${await newAnalysis()}/cancel` },
  "read notes": { method: "GET", path: async () => `/api/v1/takes/${await takeWithNotes()}/notes` },
  "save notes": {
    method: "PUT",
    path: async () => `/api/v1/takes/${await takeWithNotes()}/notes`,
    body: () => ({ baseRevision: 1, notes: [{ onsetSec: 0, offsetSec: 0.5, pitch: 61, cents: 0, velocity: 80, voice: 1 }] }),
  },
  "read tuning report": { method: "GET", path: async () => `/api/v1/takes/${await takeWithNotes()}/tuning-report` },
  "list comments": { method: "GET", path: async () => `/api/v1/takes/${await newTake()}/comments` },
  "start a comment thread": { method: "POST", path: async () => `/api/v1/takes/${await newTake()}/comments`, body: () => ({ body: "Watch the third bar." }) },
  "list share links": { method: "GET", path: async () => `/api/v1/takes/${await newTake()}/share-links` },
  "create share link": { method: "POST", path: async () => `/api/v1/takes/${await newTake()}/share-links`, body: () => ({ expiresInDays: 3 }) },
  "attach assignment from a take": { method: "PUT", path: async () => `/api/v1/takes/${await takeWithNotes()}/assignment`, body: () => ({ fromTakeId: sourceTake }) },
  "export CSV": { method: "GET", path: async () => `/api/v1/takes/${await takeWithNotes()}/export?format=csv` },
  "export MIDI": { method: "GET", path: async () => `/api/v1/takes/${await takeWithNotes()}/export?format=midi` },
  "read credits": { method: "GET", path: () => "/api/v1/credits" },
  "buy export pack": { method: "POST", path: () => "/api/v1/billing/checkout", body: () => ({ pack: "no-such-pack" }) },
  "list API keys": { method: "GET", path: () => "/api/v1/api-keys" },
  "create API key": { method: "POST", path: () => "/api/v1/api-keys", body: () => ({ name: `Script ${++seq}`, role: "listener" }) },
  "revoke API key": { method: "DELETE", path: async () => `/api/v1/api-keys/${await newApiKey()}` },
};

// Outsiders act in a studio of their own: list-type calls answer for that studio (and must not
// show this studio's data); anything addressed by id in this studio is 404, as if it did not exist.
const MATRIX: Record<keyof typeof OPS, Record<Principal, number>> = {
  "list projects":      { signedOut: 401, outsider: 200, listener: 200, editor: 200, owner: 200 },
  "create project":     { signedOut: 401, outsider: 201, listener: 403, editor: 201, owner: 201 },
  "read project":       { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "rename project":     { signedOut: 401, outsider: 404, listener: 403, editor: 200, owner: 200 },
  "delete project":     { signedOut: 401, outsider: 404, listener: 403, editor: 204, owner: 204 },
  "read studio":        { signedOut: 401, outsider: 200, listener: 200, editor: 200, owner: 200 },
  "rename studio":      { signedOut: 401, outsider: 200, listener: 403, editor: 403, owner: 200 },
  "switch to studio":   { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "list members":       { signedOut: 401, outsider: 200, listener: 200, editor: 200, owner: 200 },
  "change member role": { signedOut: 401, outsider: 404, listener: 403, editor: 403, owner: 200 },
  "remove member":      { signedOut: 401, outsider: 404, listener: 403, editor: 403, owner: 204 },
  "list invitations":   { signedOut: 401, outsider: 200, listener: 403, editor: 403, owner: 200 },
  "invite":             { signedOut: 401, outsider: 201, listener: 403, editor: 403, owner: 201 },
  "revoke invitation":  { signedOut: 401, outsider: 404, listener: 403, editor: 403, owner: 204 },
  "list takes":         { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "upload take":        { signedOut: 401, outsider: 404, listener: 403, editor: 201, owner: 201 },
  "read take":          { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "play take audio":    { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "delete take":        { signedOut: 401, outsider: 404, listener: 403, editor: 204, owner: 204 },
  "list analyses":      { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "re-analyse take":    { signedOut: 401, outsider: 404, listener: 403, editor: 202, owner: 202 },
  "read analysis":      { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "cancel analysis":    { signedOut: 401, outsider: 404, listener: 403, editor: 200, owner: 200 },
  "read notes":         { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "save notes":         { signedOut: 401, outsider: 404, listener: 403, editor: 201, owner: 201 },
  "read tuning report": { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "list comments":      { signedOut: 401, outsider: 404, listener: 200, editor: 200, owner: 200 },
  "start a comment thread": { signedOut: 401, outsider: 404, listener: 403, editor: 201, owner: 201 },
  "list share links":   { signedOut: 401, outsider: 404, listener: 403, editor: 200, owner: 200 },
  "create share link":  { signedOut: 401, outsider: 404, listener: 403, editor: 201, owner: 201 },
  "attach assignment from a take": { signedOut: 401, outsider: 404, listener: 403, editor: 201, owner: 201 },
  "export CSV":         { signedOut: 401, outsider: 404, listener: 403, editor: 200, owner: 200 },
  "export MIDI":        { signedOut: 401, outsider: 404, listener: 403, editor: 200, owner: 200 },
  "read credits":       { signedOut: 401, outsider: 200, listener: 200, editor: 200, owner: 200 },
  // an invalid pack, so the owner's cell is the validation (422) and no payment is started
  "buy export pack":    { signedOut: 401, outsider: 422, listener: 403, editor: 403, owner: 422 },
  "list API keys":      { signedOut: 401, outsider: 200, listener: 403, editor: 200, owner: 200 },
  "create API key":     { signedOut: 401, outsider: 201, listener: 403, editor: 201, owner: 201 },
  "revoke API key":     { signedOut: 401, outsider: 404, listener: 403, editor: 204, owner: 204 },
};

beforeAll(async () => {
  app = await startTestApp({ FREE_MONTHLY_EXPORTS: "1000" });
  cookies.owner = await signUpVerified("owner@matrix.test", "Rosa Quint");
  const studio = await (await call("GET", "/api/v1/studio", { cookie: cookies.owner })).json();
  studioId = studio.studio.id;
  for (const role of ["listener", "editor"] as const) {
    const email = `${role}@matrix.test`;
    cookies[role] = await signUpVerified(email);
    await asOwner("POST", "/api/v1/invitations", { email, role });
    const { readMailbox } = await import("@/lib/mail/mailbox");
    const [mail] = (await readMailbox({ to: email })).filter((m) => m.subject.startsWith("Invitation"));
    const token = decodeURIComponent(mail!.text.match(/invitations\/(\S+)/)![1]!);
    const accept = await call("POST", "/api/v1/invitations/accept", { cookie: cookies[role], body: { token } });
    expect(accept.status).toBe(200);
    // act in the invited studio, not the personal one
    const cookie = accept.headers.getSetCookie().map((c) => c.split(";")[0]).join("; ");
    cookies[role] = `${cookies[role]}; ${cookie}`;
  }
  cookies.outsider = await signUpVerified("outsider@elsewhere.test", "Theo Outsider");
  takeProject = (await asOwner("POST", "/api/v1/projects", { name: "Matrix takes" })).project.id;
  sourceTake = await takeWithNotes();
}, 120_000);
afterAll(async () => app.close());

describe("access-control matrix", () => {
  it("has a cell for every operation × caller", () => {
    expect(Object.keys(MATRIX).sort()).toEqual(Object.keys(OPS).sort());
    for (const row of Object.values(MATRIX)) expect(Object.keys(row).sort()).toEqual([...PRINCIPALS].sort());
  });

  for (const [name, op] of Object.entries(OPS)) {
    for (const who of PRINCIPALS) {
      const expected = MATRIX[name as keyof typeof OPS][who];
      it(`${name} as ${who} → ${expected}`, async () => {
        const path = await op.path();
        const body = op.body?.();
        const res = await call(op.method, path, body instanceof FormData ? { cookie: cookies[who], rawBody: body } : { cookie: cookies[who], body });
        const text = await res.text();
        expect(res.status, text).toBe(expected);
        if (expected >= 400) {
          const body = JSON.parse(text);
          expect(Object.keys(body)).toEqual(["error"]);
          expect(typeof body.error.code).toBe("string");
          expect(body.error.message).not.toMatch(/sqlite|select |stack|at .*\.ts/i);
        }
        if (who === "outsider" && expected < 300 && text) {
          // the outsider's answer is about their own studio, never this one
          expect(text).not.toContain(studioId);
          expect(text).not.toContain("Matrix project");
          expect(text).not.toContain("Matrix takes");
          expect(text).not.toContain("owner@matrix.test");
        }
      });
    }
  }
});
