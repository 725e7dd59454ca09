"use client";
import { useCallback, useEffect, useRef, useState } from "react";
import { ApiClientError, apiFetch } from "@/lib/client/api";
import {
  conflicted,
  createSaveQueue,
  dueAtMs,
  edited,
  failed,
  hasUnsavedEdits,
  keepMine as keepMineOp,
  retry as retryOp,
  start,
  statusOf,
  succeeded,
  takeTheirs as takeTheirsOp,
  withIds,
  withoutIds,
  type EditorNote,
  type NoteList,
  type SaveQueue,
} from "@/lib/editor";
import type { CurveNotesDto } from "@/components/report/types";

/** Saves wait this long after the last edit (ms). */
export const SAVE_DEBOUNCE_MS = 800;

export type SavedRevision = { number: number; noteCount: number; createdAt: string; createdBy: string | null };

/** The other side of a conflict: the newest revision on the server. */
export type TheirSide =
  | { state: "loading" }
  | { state: "error"; message: string }
  | { state: "ready"; revision: number; referenceHz: number; notes: EditorNote[] };

/**
 * The thin, effectful half of saving: a timer and the PUT, over the pure queue of
 * lib/editor/save-queue. Warns before the page is left with unsaved edits.
 */
export function useSaveQueue({
  takeId,
  referenceHz,
  enabled,
  onSaved,
  initialBase,
  initialNotes,
  debounceMs = SAVE_DEBOUNCE_MS,
}: {
  takeId: string;
  /** The revision the editor starts from (0 = the draft) and its notes, as the editor holds them. */
  initialBase: number;
  initialNotes: NoteList;
  referenceHz: number;
  enabled: boolean;
  /** After each saved revision, with the notes it holds. */
  onSaved: (revision: SavedRevision, notes: NoteList) => void;
  debounceMs?: number;
}) {
  const queue = useRef<SaveQueue>(createSaveQueue(initialBase, initialNotes));
  const [, setVersion] = useState(0);
  const [theirs, setTheirs] = useState<TheirSide | null>(null);
  const [lastSaved, setLastSaved] = useState<SavedRevision | null>(null);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const live = useRef({ takeId, referenceHz, onSaved, debounceMs, enabled });
  live.current = { takeId, referenceHz, onSaved, debounceMs, enabled };
  const mounted = useRef(true);

  const loadTheirs = useCallback(async () => {
    setTheirs({ state: "loading" });
    try {
      const dto = await apiFetch<CurveNotesDto>(`/api/v1/takes/${live.current.takeId}/notes?curves=1`);
      if (mounted.current) setTheirs({ state: "ready", revision: dto.revision ?? 0, referenceHz: dto.referenceHz, notes: withIds(dto.notes) });
    } catch (e) {
      if (mounted.current) setTheirs({ state: "error", message: e instanceof Error ? e.message : "The newest revision could not be loaded." });
    }
  }, []);

  // declared before use through a ref, as the two call each other
  const schedule = useRef<() => void>(() => undefined);

  const set = useCallback((next: SaveQueue) => {
    if (next === queue.current) return;
    queue.current = next;
    setVersion((v) => v + 1);
    schedule.current();
  }, []);

  const send = useCallback(async () => {
    const begun = start(queue.current);
    if (!begun || !live.current.enabled) return;
    set(begun.queue);
    const { request } = begun;
    try {
      const res = await apiFetch<{ revision: SavedRevision }>(`/api/v1/takes/${live.current.takeId}/notes`, {
        method: "PUT",
        // pitch curves go along: a revision stores its notes whole, and the roll and the tuning report draw them
        json: { baseRevision: request.baseRevision, referenceHz: live.current.referenceHz, notes: withoutIds(request.notes) },
      });
      set(succeeded(queue.current, res.revision.number));
      setLastSaved(res.revision);
      live.current.onSaved(res.revision, request.notes);
    } catch (e) {
      if (e instanceof ApiClientError && e.status === 409) {
        set(conflicted(queue.current, e.message));
        void loadTheirs();
      } else {
        const message =
          e instanceof ApiClientError
            ? e.status === 403
              ? "You may not save changes to this take (your role is listener)."
              : e.status === 422
                ? `The notes were refused: ${e.message}`
                : e.message
            : "The notes could not be saved.";
        set(failed(queue.current, message));
      }
    }
  }, [set, loadTheirs]);

  schedule.current = () => {
    if (timer.current) clearTimeout(timer.current);
    timer.current = null;
    const due = dueAtMs(queue.current, live.current.debounceMs);
    if (due === null) return;
    timer.current = setTimeout(() => void send(), Math.max(0, due - Date.now()));
  };

  useEffect(() => {
    mounted.current = true;
    return () => {
      mounted.current = false;
      if (timer.current) clearTimeout(timer.current);
    };
  }, []);

  // a warning before leaving with edits that are not saved yet
  useEffect(() => {
    const onBeforeUnload = (e: BeforeUnloadEvent) => {
      if (!hasUnsavedEdits(queue.current)) return;
      e.preventDefault();
      e.returnValue = "";
    };
    window.addEventListener("beforeunload", onBeforeUnload);
    return () => window.removeEventListener("beforeunload", onBeforeUnload);
  }, []);

  const q = queue.current;
  return {
    status: statusOf(q),
    error: q.error,
    conflictMessage: q.conflict?.message ?? null,
    baseRevision: q.baseRevision,
    saved: q.saved,
    hasUnsaved: hasUnsavedEdits(q),
    lastSaved,
    theirs,
    /** Starts over from a revision (0 = the draft) the editor has just loaded. */
    reset: useCallback(
      (baseRevision: number, notes: NoteList) => {
        set(createSaveQueue(baseRevision, notes));
        setTheirs(null);
      },
      [set],
    ),
    edited: useCallback((notes: NoteList) => set(edited(queue.current, notes, Date.now())), [set]),
    retry: useCallback(() => set(retryOp(queue.current)), [set]),
    /** Sends what is pending now instead of after the debounce (e.g. a restore). */
    flush: useCallback(() => set(retryOp(queue.current)), [set]),
    reloadTheirs: loadTheirs,
    keepMine: useCallback(
      (mine: NoteList) => {
        const t = theirs;
        if (t?.state !== "ready") return;
        set(keepMineOp(queue.current, t.revision, t.notes, mine));
        setTheirs(null);
      },
      [set, theirs],
    ),
    /** Discards mine; returns their notes for the editor to load. */
    takeTheirs: useCallback((): { revision: number; notes: EditorNote[] } | null => {
      const t = theirs;
      if (t?.state !== "ready") return null;
      set(takeTheirsOp(queue.current, t.revision, t.notes));
      setTheirs(null);
      return { revision: t.revision, notes: t.notes };
    }, [set, theirs]),
  };
}
