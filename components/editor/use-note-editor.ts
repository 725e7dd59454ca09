"use client";
import { useCallback, useMemo, useReducer, useRef, useState } from "react";
import {
  EMPTY_SELECTION,
  apply,
  canRedo,
  canUndo,
  copyNotes,
  createHistory,
  freshIds,
  moveNotes,
  pasteNotes,
  pruneSelection,
  redo,
  removeNotes,
  resetCents,
  setVelocity,
  undo,
  type Clipboard,
  type History,
  type NoteList,
  type Selection,
} from "@/lib/editor";

type State = { history: History<NoteList>; selection: Selection };
type Action =
  | { type: "edit"; notes: NoteList; selection?: Selection }
  | { type: "undo" }
  | { type: "redo" }
  | { type: "load"; notes: NoteList; selection?: Selection }
  | { type: "select"; selection: Selection };

function reducer(s: State, a: Action): State {
  switch (a.type) {
    case "edit": {
      const history = apply(s.history, a.notes);
      const selection = pruneSelection(history.present, a.selection ?? s.selection);
      return history === s.history && selection === s.selection ? s : { history, selection };
    }
    case "undo":
    case "redo": {
      const history = a.type === "undo" ? undo(s.history) : redo(s.history);
      if (history === s.history) return s;
      return { history, selection: pruneSelection(history.present, s.selection) };
    }
    case "load":
      return { history: createHistory(a.notes), selection: pruneSelection(a.notes, a.selection ?? s.selection) };
    case "select":
      return a.selection === s.selection ? s : { ...s, selection: a.selection };
  }
}

export type NoteEditor = ReturnType<typeof useNoteEditor>;

/**
 * The editor's one source of truth: the note list with its undo/redo history (without a limit
 * inside a session, lib/editor/history), the selection and the clipboard. The piano roll, the
 * toolbar, the inspector and the keyboard shortcuts all go through it, so they share one history.
 */
export function useNoteEditor(initial: NoteList) {
  const [state, dispatch] = useReducer(reducer, initial, (notes) => ({ history: createHistory(notes), selection: EMPTY_SELECTION }));
  const [clipboard, setClipboard] = useState<Clipboard | null>(null);
  const latest = useRef(state);
  latest.current = state;

  const notes = state.history.present;
  const selection = state.selection;

  const edit = useCallback((next: NoteList, nextSelection?: Selection) => dispatch({ type: "edit", notes: next, selection: nextSelection }), []);
  const select = useCallback((next: Selection) => dispatch({ type: "select", selection: next }), []);
  const load = useCallback((next: NoteList, nextSelection?: Selection) => dispatch({ type: "load", notes: next, selection: nextSelection }), []);
  const doUndo = useCallback(() => dispatch({ type: "undo" }), []);
  const doRedo = useCallback(() => dispatch({ type: "redo" }), []);

  /** Edits the selected notes with `op`; nothing when none is selected. */
  const onSelection = useCallback((op: (notes: NoteList, ids: string[]) => NoteList, nextSelection?: Selection) => {
    const { history, selection: sel } = latest.current;
    if (sel.size === 0) return;
    dispatch({ type: "edit", notes: op(history.present, [...sel]), selection: nextSelection });
  }, []);

  const actions = useMemo(
    () => ({
      remove: () => onSelection(removeNotes, EMPTY_SELECTION),
      setVelocity: (velocity: number) => onSelection((ns, ids) => setVelocity(ns, ids, velocity)),
      resetCents: () => onSelection(resetCents),
      nudge: (deltaSec: number, deltaPitch: number) => onSelection((ns, ids) => moveNotes(ns, ids, deltaSec, deltaPitch)),
      selectAll: () => select(new Set(latest.current.history.present.map((n) => n.id))),
      clearSelection: () => select(EMPTY_SELECTION),
      copy: () => {
        const { history, selection: sel } = latest.current;
        if (sel.size === 0) return false;
        setClipboard(copyNotes(history.present, sel));
        return true;
      },
      cut: () => {
        const { history, selection: sel } = latest.current;
        if (sel.size === 0) return false;
        setClipboard(copyNotes(history.present, sel));
        dispatch({ type: "edit", notes: removeNotes(history.present, sel), selection: EMPTY_SELECTION });
        return true;
      },
    }),
    [onSelection, select],
  );

  /** Pastes the clipboard with its first note at `atSec`; the pasted notes become the selection. */
  const paste = useCallback(
    (atSec: number) => {
      if (!clipboard || clipboard.notes.length === 0) return;
      const present = latest.current.history.present;
      const ids = freshIds(present, clipboard.notes.length);
      dispatch({ type: "edit", notes: pasteNotes(present, clipboard, atSec, ids), selection: new Set(ids) });
    },
    [clipboard],
  );

  return {
    notes,
    selection,
    canUndo: canUndo(state.history),
    canRedo: canRedo(state.history),
    edit,
    select,
    load,
    undo: doUndo,
    redo: doRedo,
    paste,
    clipboard,
    ...actions,
  };
}
