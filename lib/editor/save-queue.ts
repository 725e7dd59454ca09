/**
 * The piano roll's saving, as a pure state machine: every edit becomes a new numbered revision
 * through `PUT /api/v1/takes/{id}/notes`, debounced, one request at a time, and no edit is ever
 * dropped — a failed or refused request keeps its notes as pending, and edits made while a
 * request is in flight are sent after it, on top of the revision it created.
 *
 * Each value is a whole note list (the editor's present), so a later edit supersedes an earlier
 * one that was not sent yet: sending the newest list saves everything. Lists are compared by
 * identity, as the editor's history hands back the very same list on undo.
 *
 * The hook (components/editor/use-save-queue.ts) owns the timer and the fetch; everything it
 * decides comes from here.
 */
import type { NoteList } from "./types";

export type SaveStatus = "saved" | "unsaved" | "saving" | "failed" | "conflict";

export type SaveQueue = {
  /** The revision the next request builds on (0 = the analysis's draft). */
  readonly baseRevision: number;
  /** The notes of `baseRevision`, as the server has them. */
  readonly saved: NoteList;
  /** The newest edits not sent yet, or null. */
  readonly pending: NoteList | null;
  /** When the newest edit came (ms, the caller's clock), for the debounce. */
  readonly editedAtMs: number;
  /** The notes of the request on its way, or null. */
  readonly inFlight: NoteList | null;
  /** The last failure's message; kept until a request succeeds. */
  readonly error: string | null;
  /** Set after a failure: wait for `retry` or a new edit instead of sending again on a timer. */
  readonly held: boolean;
  /** A 409: someone saved a newer revision. Nothing is sent until `keepMine` or `takeTheirs`. */
  readonly conflict: { readonly message: string } | null;
};

export function createSaveQueue(baseRevision: number, saved: NoteList): SaveQueue {
  return { baseRevision, saved, pending: null, editedAtMs: 0, inFlight: null, error: null, held: false, conflict: null };
}

/** What the server will have once the request in flight (if any) lands. */
function latest(q: SaveQueue): NoteList {
  return q.inFlight ?? q.saved;
}

/** An edit: `notes` is the editor's new present. Going back to what is (being) saved leaves nothing pending. */
export function edited(q: SaveQueue, notes: NoteList, nowMs: number): SaveQueue {
  const pending = notes === latest(q) ? null : notes;
  if (pending === q.pending) return q;
  return { ...q, pending, editedAtMs: nowMs, held: false };
}

/** When the next request should start (ms), or null when there is nothing to send now. */
export function dueAtMs(q: SaveQueue, debounceMs: number): number | null {
  if (q.pending === null || q.inFlight !== null || q.conflict !== null || q.held) return null;
  return q.editedAtMs + debounceMs;
}

export type SaveRequest = { baseRevision: number; notes: NoteList };

/** Starts a request with the pending notes; null when one is in flight, a conflict waits or nothing is pending. */
export function start(q: SaveQueue): { queue: SaveQueue; request: SaveRequest } | null {
  if (q.pending === null || q.inFlight !== null || q.conflict !== null) return null;
  return {
    queue: { ...q, inFlight: q.pending, pending: null, held: false },
    request: { baseRevision: q.baseRevision, notes: q.pending },
  };
}

/** The request saved revision `revision`; edits made meanwhile stay pending, now on top of it. */
export function succeeded(q: SaveQueue, revision: number): SaveQueue {
  if (q.inFlight === null) return q;
  const saved = q.inFlight;
  return { ...q, baseRevision: revision, saved, inFlight: null, error: null, held: false, pending: q.pending === saved ? null : q.pending };
}

/** The request failed (network, 5xx, 4xx other than 409): its notes are pending again unless newer ones are. */
export function failed(q: SaveQueue, message: string): SaveQueue {
  if (q.inFlight === null) return q;
  const pending = q.pending ?? (q.inFlight === q.saved ? null : q.inFlight);
  return { ...q, inFlight: null, pending, error: message, held: true };
}

/** A 409: a newer revision exists. Mine stay pending, and nothing is sent until the user decides. */
export function conflicted(q: SaveQueue, message: string): SaveQueue {
  if (q.inFlight === null) return q;
  return { ...q, inFlight: null, pending: q.pending ?? q.inFlight, conflict: { message }, error: null, held: false };
}

/** Retry after a failure: send the pending notes now. */
export function retry(q: SaveQueue): SaveQueue {
  if (q.pending === null || q.conflict !== null) return { ...q, held: false };
  return { ...q, held: false, editedAtMs: -Infinity };
}

/** Keep mine: my notes are saved as a new revision on top of theirs (`theirRevision`), right away. */
export function keepMine(q: SaveQueue, theirRevision: number, theirNotes: NoteList, mine: NoteList): SaveQueue {
  return { ...q, baseRevision: theirRevision, saved: theirNotes, pending: mine === theirNotes ? null : mine, editedAtMs: -Infinity, conflict: null, held: false, error: null };
}

/** Take theirs: mine are discarded and the editor shows theirs, which are what the server has. */
export function takeTheirs(q: SaveQueue, theirRevision: number, theirNotes: NoteList): SaveQueue {
  return createSaveQueue(theirRevision, theirNotes);
}

export function statusOf(q: SaveQueue): SaveStatus {
  if (q.conflict) return "conflict";
  if (q.inFlight) return "saving";
  if (q.error && q.pending) return "failed";
  return q.pending ? "unsaved" : "saved";
}

/** True while leaving the page would lose an edit. */
export function hasUnsavedEdits(q: SaveQueue): boolean {
  return q.pending !== null || q.inFlight !== null || q.conflict !== null;
}
