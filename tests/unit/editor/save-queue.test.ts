import { describe, expect, it } from "vitest";
import {
  conflicted,
  createSaveQueue,
  dueAtMs,
  edited,
  failed,
  hasUnsavedEdits,
  keepMine,
  moveNotes,
  retry,
  start,
  statusOf,
  succeeded,
  takeTheirs,
  type NoteList,
  type SaveQueue,
} from "@/lib/editor";
import { note, rng } from "./helpers";

const DEBOUNCE = 800;
const base: NoteList = [note("n1", 0, 1, 60), note("n2", 1, 2, 64)];
const up = moveNotes(base, ["n1"], 0, 1);
const upMore = moveNotes(up, ["n1"], 0, 1);

function send(q: SaveQueue) {
  const s = start(q);
  if (!s) throw new Error("nothing to send");
  return s;
}

describe("save queue", () => {
  it("starts saved, with nothing to send", () => {
    const q = createSaveQueue(3, base);
    expect(statusOf(q)).toBe("saved");
    expect(dueAtMs(q, DEBOUNCE)).toBeNull();
    expect(start(q)).toBeNull();
    expect(hasUnsavedEdits(q)).toBe(false);
  });

  it("debounces: the save is due a debounce after the last edit, and sends the newest list", () => {
    let q = edited(createSaveQueue(0, base), up, 1000);
    expect(statusOf(q)).toBe("unsaved");
    expect(dueAtMs(q, DEBOUNCE)).toBe(1800);
    q = edited(q, upMore, 1500);
    expect(dueAtMs(q, DEBOUNCE)).toBe(2300);
    const { request } = send(q);
    expect(request).toEqual({ baseRevision: 0, notes: upMore });
  });

  it("an edit undone before the save leaves nothing to send", () => {
    let q = edited(createSaveQueue(2, base), up, 0);
    q = edited(q, base, 100);
    expect(statusOf(q)).toBe("saved");
    expect(dueAtMs(q, DEBOUNCE)).toBeNull();
  });

  it("after a success the next edit builds on the new revision", () => {
    let q = edited(createSaveQueue(4, base), up, 0);
    const s = send(q);
    expect(statusOf(s.queue)).toBe("saving");
    q = succeeded(s.queue, 5);
    expect(statusOf(q)).toBe("saved");
    expect(q.baseRevision).toBe(5);
    expect(q.saved).toBe(up);
    q = edited(q, upMore, 10);
    expect(send(q).request.baseRevision).toBe(5);
  });

  it("edits made while a save is in flight are sent after it, on the revision it made", () => {
    let q = send(edited(createSaveQueue(1, base), up, 0)).queue;
    q = edited(q, upMore, 50);
    expect(statusOf(q)).toBe("saving");
    expect(dueAtMs(q, DEBOUNCE)).toBeNull(); // one request at a time
    expect(start(q)).toBeNull();
    q = succeeded(q, 2);
    expect(statusOf(q)).toBe("unsaved");
    expect(dueAtMs(q, DEBOUNCE)).toBe(850);
    expect(send(q).request).toEqual({ baseRevision: 2, notes: upMore });
  });

  it("an undo back to the saved notes while a save is in flight is saved after it (the server will have the edit)", () => {
    let q = send(edited(createSaveQueue(1, base), up, 0)).queue;
    q = edited(q, base, 10); // undo
    q = succeeded(q, 2);
    expect(send(q).request).toEqual({ baseRevision: 2, notes: base });
  });

  it("a failure keeps the edit, shows the message, and waits for a retry or the next edit", () => {
    let q = send(edited(createSaveQueue(1, base), up, 0)).queue;
    q = failed(q, "Tapernote could not be reached.");
    expect(statusOf(q)).toBe("failed");
    expect(q.error).toBe("Tapernote could not be reached.");
    expect(q.pending).toBe(up);
    expect(hasUnsavedEdits(q)).toBe(true);
    expect(dueAtMs(q, DEBOUNCE)).toBeNull();
    q = retry(q);
    expect(dueAtMs(q, DEBOUNCE)).toBe(-Infinity); // now
    expect(send(q).request).toEqual({ baseRevision: 1, notes: up });
  });

  it("a failure while newer edits wait keeps the newer ones (they contain the older)", () => {
    let q = send(edited(createSaveQueue(1, base), up, 0)).queue;
    q = edited(q, upMore, 10);
    q = failed(q, "boom");
    expect(q.pending).toBe(upMore);
    q = edited(q, moveNotes(upMore, ["n2"], 0.5, 0), 20); // a new edit tries again by itself
    expect(dueAtMs(q, DEBOUNCE)).toBe(820);
  });

  it("the failure's message stays until a save succeeds", () => {
    let q = failed(send(edited(createSaveQueue(1, base), up, 0)).queue, "boom");
    q = send(retry(q)).queue;
    expect(statusOf(q)).toBe("saving");
    expect(q.error).toBe("boom");
    q = succeeded(q, 2);
    expect(q.error).toBeNull();
    expect(statusOf(q)).toBe("saved");
  });

  it("a 409 holds my notes and sends nothing until I choose", () => {
    let q = send(edited(createSaveQueue(3, base), up, 0)).queue;
    q = conflicted(q, "revision 4 has been saved since");
    expect(statusOf(q)).toBe("conflict");
    expect(q.pending).toBe(up);
    expect(dueAtMs(q, DEBOUNCE)).toBeNull();
    q = edited(q, upMore, 10); // I keep editing: still held
    expect(start(q)).toBeNull();
    expect(hasUnsavedEdits(q)).toBe(true);
  });

  it("keep mine saves my notes on top of theirs, at once", () => {
    const theirs: NoteList = [note("n1", 0, 1, 67)];
    let q = conflicted(send(edited(createSaveQueue(3, base), up, 0)).queue, "conflict");
    q = keepMine(q, 4, theirs, up);
    expect(statusOf(q)).toBe("unsaved");
    expect(dueAtMs(q, DEBOUNCE)).toBe(-Infinity);
    expect(send(q).request).toEqual({ baseRevision: 4, notes: up });
  });

  it("take theirs discards mine: saved at their revision", () => {
    const theirs: NoteList = [note("n1", 0, 1, 67)];
    let q = conflicted(send(edited(createSaveQueue(3, base), up, 0)).queue, "conflict");
    q = takeTheirs(q, 4, theirs);
    expect(statusOf(q)).toBe("saved");
    expect(q.baseRevision).toBe(4);
    expect(q.saved).toBe(theirs);
    expect(hasUnsavedEdits(q)).toBe(false);
  });

  it("never drops an edit over a long random run of edits, failures and successes", () => {
    // a seeded walk: whatever happens, the newest list is either saved or still pending/in flight
    const rand = rng(7);
    let q = createSaveQueue(0, base);
    let present: NoteList = base;
    let server = 0;
    let serverNotes: NoteList = base;
    for (let step = 0; step < 2000; step++) {
      const r = rand();
      if (r < 0.4) {
        present = moveNotes(present, ["n1"], 0.01, rand() < 0.5 ? 1 : -1);
        q = edited(q, present, step);
      } else if (r < 0.6) {
        const s = start(q);
        if (s) {
          expect(s.request.baseRevision).toBe(server);
          q = s.queue;
        }
      } else if (r < 0.8 && q.inFlight) {
        server++;
        serverNotes = q.inFlight;
        q = succeeded(q, server);
      } else if (q.inFlight) {
        q = failed(q, "boom");
        q = retry(q);
      }
      const newest = q.pending ?? q.inFlight ?? q.saved;
      expect(newest).toBe(present);
      expect(q.saved).toBe(serverNotes);
    }
  });
});
