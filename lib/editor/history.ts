/**
 * Undo/redo history over immutable values, without a limit (a session's edits).
 * `apply` after an `undo` drops the redo branch.
 */
export type History<T> = { readonly past: readonly T[]; readonly present: T; readonly future: readonly T[] };

export function createHistory<T>(initial: T): History<T> {
  return { past: [], present: initial, future: [] };
}

/** Records `next` as the new present; the same value (by identity) is not an edit. */
export function apply<T>(history: History<T>, next: T): History<T> {
  if (Object.is(next, history.present)) return history;
  return { past: [...history.past, history.present], present: next, future: [] };
}

export function canUndo<T>(history: History<T>): boolean {
  return history.past.length > 0;
}

export function canRedo<T>(history: History<T>): boolean {
  return history.future.length > 0;
}

export function undo<T>(history: History<T>): History<T> {
  if (!canUndo(history)) return history;
  const past = history.past.slice(0, -1);
  return { past, present: history.past[history.past.length - 1] as T, future: [history.present, ...history.future] };
}

export function redo<T>(history: History<T>): History<T> {
  if (!canRedo(history)) return history;
  const [next, ...future] = history.future;
  return { past: [...history.past, history.present], present: next as T, future };
}

/** Replaces the present without recording an edit (e.g. after a save from elsewhere). */
export function reset<T>(value: T): History<T> {
  return createHistory(value);
}
