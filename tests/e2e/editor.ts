// Browser steps for the take page's editor (issue 5): editing, saving revisions, undo, conflicts, listeners read-only. Called from run.ts.
//
// Saving, as designed: every change is saved as the next revision (debounced). An undo is a change
// too: after "drag up" saved as n+1, the undo saves the notes as they were as n+2 — the revisions
// are a history that is never rewritten.
import assert from "node:assert/strict";
import type { Page } from "playwright-core";
import { signInAs } from "./harness";
import { KEYBOARD_PX, RULER_PX } from "../../components/piano-roll/geometry";
import type { TeachingContext } from "./teaching";

const PROJECT = "Grade 3 chord exercises";
const TAKE = "Chord exercise in C — Mila, week 4";

type Note = { onsetSec: number; offsetSec: number; pitch: number; cents: number; velocity: number; voice: number };
type NotesDto = { source: "draft" | "revision"; revision?: number; notes: Note[] };

const key = (n: Note) => `${n.onsetSec.toFixed(4)}|${n.offsetSec.toFixed(4)}|${n.pitch}|${n.voice}`;
const sameNotes = (a: Note[], b: Note[]) => JSON.stringify(a.map(key).sort()) === JSON.stringify(b.map(key).sort());

/** The roll's current mapping (the canvas carries it in data- attributes) and its box on the page. */
async function rollView(page: Page) {
  const roll = page.getByTestId("piano-roll");
  await roll.scrollIntoViewIfNeeded();
  await page.waitForFunction(() => (document.querySelector('[data-testid="piano-roll"]') as HTMLElement | null)?.dataset.pxPerSec !== undefined);
  const d = await roll.evaluate((c: HTMLCanvasElement) => ({ startSec: c.dataset.startSec, pxPerSec: c.dataset.pxPerSec, topPitch: c.dataset.topPitch, rowPx: c.dataset.rowPx, border: c.clientLeft, width: c.clientWidth, height: c.clientHeight }));
  const box = (await roll.boundingBox())!;
  const v = { startSec: Number(d.startSec), pxPerSec: Number(d.pxPerSec), topPitch: Number(d.topPitch), rowPx: Number(d.rowPx) };
  return {
    ...v,
    width: d.width,
    height: d.height,
    /** Page coordinates of a time and the middle of a pitch's row. */
    at: (sec: number, pitch: number) => ({
      x: box.x + d.border + KEYBOARD_PX + (sec - v.startSec) * v.pxPerSec,
      y: box.y + d.border + RULER_PX + (v.topPitch - pitch) * v.rowPx + v.rowPx / 2,
    }),
    visible: (n: Note) => {
      const x0 = KEYBOARD_PX + (n.onsetSec - v.startSec) * v.pxPerSec;
      const x1 = KEYBOARD_PX + (n.offsetSec - v.startSec) * v.pxPerSec;
      const y = RULER_PX + (v.topPitch - n.pitch) * v.rowPx;
      return x0 >= KEYBOARD_PX + 4 && x1 <= d.width - 4 && y >= RULER_PX + v.rowPx * 2 && y + v.rowPx <= d.height - v.rowPx;
    },
  };
}

export function editorSteps({ page, baseUrl, shot }: TeachingContext): [string, () => Promise<void>][] {
  let takeUrl = "";
  let takeId = "";
  let startRevision = 0;
  let before: Note[] = [];
  let moved: Note | null = null;

  const signIn = (email: string) => signInAs(page, baseUrl, email);
  const api = async (path: string) => {
    const res = await page.request.get(`${baseUrl}${path}`);
    assert.equal(res.status(), 200, `${path} answered ${res.status()}`);
    return res.json();
  };
  const savedAs = async (revision: number) => {
    await page.locator(`[data-testid="save-status"][data-state="saved"][data-revision="${revision}"]`).waitFor({ timeout: 20_000 });
  };

  return [
    ["editor: the teacher opens the demo take's piano roll, ready to edit", async () => {
      await signIn("editor@example.com");
      await page.getByRole("link", { name: PROJECT }).click();
      await page.getByRole("link", { name: TAKE }).click();
      await page.getByRole("heading", { name: TAKE }).waitFor();
      takeUrl = page.url().replace(/[?#].*$/, "");
      takeId = takeUrl.split("/takes/")[1]!;
      await page.locator('[data-testid="note-editor"][data-editable="true"]').waitFor({ timeout: 60_000 });
      await page.getByRole("toolbar", { name: "Piano roll tools" }).waitFor();
      await page.getByTestId("take-timeline").waitFor();
      const dto = (await api(`/api/v1/takes/${takeId}/notes`)) as NotesDto;
      startRevision = dto.revision ?? 0;
      before = dto.notes;
      assert.ok(before.length > 0, "the demo take has notes");
      await savedAs(startRevision);
      await page.getByTestId("note-editor").scrollIntoViewIfNeeded();
      await shot(page, "5a-editor");
    }],
    ["editor: hovering a note shows it; dragging it up a semitone saves revision n+1", async () => {
      const v = await rollView(page);
      // a note fully in view, with the row above it free where we drop it
      const candidates = before
        .filter((n) => v.visible(n) && (n.offsetSec - n.onsetSec) * v.pxPerSec > 30)
        .filter((n) => !before.some((o) => o !== n && o.pitch === n.pitch + 1 && o.onsetSec < n.offsetSec && o.offsetSec > n.onsetSec))
        .filter((n) => !before.some((o) => o !== n && o.pitch === n.pitch && o.onsetSec < n.offsetSec && o.offsetSec > n.onsetSec))
        .sort((a, b) => b.offsetSec - b.onsetSec - (a.offsetSec - a.onsetSec));
      const n = candidates[0];
      assert.ok(n, "a note to drag is in view");
      moved = n;
      const mid = (n.onsetSec + n.offsetSec) / 2;
      const from = v.at(mid, n.pitch);
      await page.mouse.move(from.x, from.y);
      await page.mouse.down();
      await page.mouse.move(from.x, from.y - v.rowPx * 0.5, { steps: 3 });
      await page.mouse.move(from.x, from.y - v.rowPx, { steps: 3 });
      await page.mouse.up();
      // the inspector shows the selected note at its new pitch
      await page.getByTestId("inspector-pitch").filter({ hasText: `MIDI ${n.pitch + 1}` }).waitFor();
      await savedAs(startRevision + 1);
      const dto = (await api(`/api/v1/takes/${takeId}/notes`)) as NotesDto;
      assert.equal(dto.revision, startRevision + 1);
      assert.equal(dto.notes.length, before.length);
      assert.ok(dto.notes.some((m) => Math.abs(m.onsetSec - n.onsetSec) < 1e-6 && m.pitch === n.pitch + 1 && m.voice === n.voice), "the moved note is a semitone up");
      assert.ok(!dto.notes.some((m) => Math.abs(m.onsetSec - n.onsetSec) < 1e-6 && m.pitch === n.pitch && m.voice === n.voice), "and no longer at its old pitch");
      // the notes table below shows the new revision too
      await page.getByText(`Revision ${startRevision + 1} · A4`).waitFor();
      await page.mouse.move(from.x + 6, from.y - v.rowPx, { steps: 2 }); // hover: the cents label
      await page.waitForTimeout(100);
      await shot(page, "5b-editor-moved");
    }],
    ["editor: undo (Ctrl+Z) saves the notes as they were as revision n+2", async () => {
      await page.keyboard.press("Control+z");
      await savedAs(startRevision + 2);
      const dto = (await api(`/api/v1/takes/${takeId}/notes`)) as NotesDto;
      assert.equal(dto.revision, startRevision + 2);
      assert.ok(sameNotes(dto.notes, before), "revision n+2 holds the notes from before the drag");
      const list = (await api(`/api/v1/takes/${takeId}/revisions`)) as { revisions: { number: number }[] };
      assert.equal(list.revisions[0]!.number, startRevision + 2);
    }],
    ["editor: after a reload the page shows revision n+2; comparing with n+1 finds the one changed note", async () => {
      await page.reload();
      await savedAs(startRevision + 2);
      await page.getByText(`Revision ${startRevision + 2} · A4`).waitFor();
      const row = page.locator(`[data-testid="revision-row"][data-revision="${startRevision + 1}"]`);
      await row.waitFor();
      await row.getByRole("button", { name: "Compare" }).click();
      const summary = page.getByTestId("revision-compare").getByTestId("diff-summary");
      await summary.waitFor();
      assert.match((await summary.textContent()) ?? "", /0 added, 0 removed, 1 changed/);
      await page.getByTestId("note-editor").scrollIntoViewIfNeeded();
      await shot(page, "5c-editor-compare");
      await page.getByRole("button", { name: "Stop comparing" }).click();
    }],
    ["editor: a revision saved elsewhere meanwhile is a conflict showing both sides; keep mine saves on top", async () => {
      // someone else saves n+3 (through the API, with the same session's cookies)
      const otherIndex = before.findIndex((n) => n !== moved);
      const other = before.map((n, i) => (i === otherIndex ? { ...n, velocity: n.velocity > 10 ? n.velocity - 10 : n.velocity + 10 } : n));
      const res = await page.request.put(`${baseUrl}/api/v1/takes/${takeId}/notes`, { headers: { origin: baseUrl }, data: { baseRevision: startRevision + 2, notes: other } });
      assert.equal(res.status(), 201);
      // here, an edit on top of n+2: select the moved note again and lift it with the arrow key
      const v = await rollView(page);
      const n = moved!;
      const p = v.at((n.onsetSec + n.offsetSec) / 2, n.pitch);
      await page.mouse.click(p.x, p.y);
      await page.getByTestId("inspector-pitch").filter({ hasText: `MIDI ${n.pitch}` }).waitFor();
      await page.keyboard.press("ArrowUp");
      const conflict = page.getByTestId("conflict");
      await conflict.waitFor({ timeout: 20_000 });
      await conflict.getByText(`Revision ${startRevision + 3} was saved while you were editing`).waitFor();
      assert.match((await conflict.getByTestId("diff-summary").textContent()) ?? "", /2 changed/);
      await page.getByTestId("save-status").and(page.locator('[data-state="conflict"]')).waitFor();
      await conflict.scrollIntoViewIfNeeded();
      await shot(page, "5d-editor-conflict");
      // nothing was overwritten meanwhile
      assert.equal(((await api(`/api/v1/takes/${takeId}/notes`)) as NotesDto).revision, startRevision + 3);
      await conflict.getByRole("button", { name: /Keep mine/ }).click();
      await savedAs(startRevision + 4);
      const dto = (await api(`/api/v1/takes/${takeId}/notes`)) as NotesDto;
      assert.equal(dto.revision, startRevision + 4);
      assert.ok(dto.notes.some((m) => Math.abs(m.onsetSec - n.onsetSec) < 1e-6 && m.pitch === n.pitch + 1), "mine are saved");
    }],
    ["editor: a save that fails keeps the edit and says why; Retry saves it", async () => {
      const n = moved!;
      const v = await rollView(page);
      const p = v.at((n.onsetSec + n.offsetSec) / 2, n.pitch + 1);
      await page.mouse.click(p.x, p.y);
      await page.getByTestId("inspector-pitch").filter({ hasText: `MIDI ${n.pitch + 1}` }).waitFor();
      await page.context().setOffline(true);
      try {
        await page.keyboard.press("ArrowDown");
        const status = page.locator('[data-testid="save-status"][data-state="failed"]');
        await status.waitFor({ timeout: 20_000 });
        assert.match((await status.textContent()) ?? "", /could not be reached/);
        await page.getByTestId("note-editor").scrollIntoViewIfNeeded();
        await shot(page, "5f-editor-save-failed");
      } finally {
        await page.context().setOffline(false);
      }
      await page.getByTestId("save-status").getByRole("button", { name: "Retry" }).click();
      await savedAs(startRevision + 5);
      const dto = (await api(`/api/v1/takes/${takeId}/notes`)) as NotesDto;
      assert.equal(dto.revision, startRevision + 5);
      assert.ok(sameNotes(dto.notes, before), "the note is back where it was");
    }],
    ["editor: a listener gets the same page read-only, and the API refuses their save (403)", async () => {
      await signIn("listener@example.com");
      await page.goto(takeUrl);
      await page.locator('[data-testid="note-editor"][data-editable="false"]').waitFor({ timeout: 60_000 });
      assert.equal(await page.getByRole("toolbar", { name: "Piano roll tools" }).count(), 0, "no editing tools");
      assert.equal(await page.getByTestId("save-status").count(), 0, "no save state");
      assert.equal(await page.getByRole("button", { name: "Restore" }).count(), 0, "no restore");
      assert.equal(await page.getByLabel("Velocity of the selected notes").count(), 0);
      await page.getByTestId("take-timeline").getByRole("button", { name: /play/i }).first().waitFor();
      const dto = (await api(`/api/v1/takes/${takeId}/notes`)) as NotesDto;
      const res = await page.request.put(`${baseUrl}/api/v1/takes/${takeId}/notes`, { headers: { origin: baseUrl }, data: { baseRevision: dto.revision ?? 0, notes: dto.notes } });
      assert.equal(res.status(), 403);
      // a tuning report link (?t=) scrolls the roll there and selects what sounds then
      const n = moved!;
      const at = Number(((n.onsetSec + n.offsetSec) / 2).toFixed(2));
      await page.goto(`${takeUrl}?t=${at}`);
      await page.locator('[data-testid="note-editor"][data-editable="false"]').waitFor();
      const sounding = dto.notes.filter((m) => m.onsetSec - 0.05 <= at && at < m.offsetSec).length;
      await page.getByTestId("inspector").getByText(sounding === 1 ? "Selected note" : `${sounding} notes selected`).waitFor();
      await page.getByTestId("note-editor").scrollIntoViewIfNeeded();
      await shot(page, "5e-listener-focused");
    }],
  ];
}
