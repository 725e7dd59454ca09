/**
 * The editor's keyboard shortcuts, as a pure table (unit-tested): a key press → a command.
 * Space stays with the transport (play/pause); keys typed into a field never reach here.
 */
import type { PianoRollTool } from "@/components/piano-roll";

export type EditorCommand =
  | { kind: "tool"; tool: PianoRollTool }
  | { kind: "undo" }
  | { kind: "redo" }
  | { kind: "copy" }
  | { kind: "cut" }
  | { kind: "paste" }
  | { kind: "delete" }
  | { kind: "selectAll" }
  | { kind: "clearSelection" }
  | { kind: "resetCents" }
  /** Moves the selection: `steps` grid steps (or nudges) in time, `semitones` in pitch. */
  | { kind: "nudge"; steps: number; semitones: number };

export type KeyPress = { key: string; ctrlKey?: boolean; metaKey?: boolean; shiftKey?: boolean; altKey?: boolean };

export const TOOL_KEYS: Record<PianoRollTool, string> = { select: "V", draw: "D", erase: "E", split: "S", join: "J" };

/** What a key press does; null when it is not a shortcut. Listeners (`editable` false) get only the selection's keys. */
export function commandFor(e: KeyPress, editable: boolean): EditorCommand | null {
  const mod = !!(e.ctrlKey || e.metaKey);
  const key = e.key.length === 1 ? e.key.toLowerCase() : e.key;
  if (mod && key === "a") return { kind: "selectAll" };
  if (key === "Escape") return { kind: "clearSelection" };
  if (!editable) return null;
  if (mod && key === "z") return e.shiftKey ? { kind: "redo" } : { kind: "undo" };
  if (mod && key === "y") return { kind: "redo" };
  if (mod && key === "c") return { kind: "copy" };
  if (mod && key === "x") return { kind: "cut" };
  if (mod && key === "v") return { kind: "paste" };
  if (mod || e.altKey) return null;
  if (key === "Delete" || key === "Backspace") return { kind: "delete" };
  if (key === "ArrowLeft") return { kind: "nudge", steps: -1, semitones: 0 };
  if (key === "ArrowRight") return { kind: "nudge", steps: 1, semitones: 0 };
  if (key === "ArrowUp") return { kind: "nudge", steps: 0, semitones: e.shiftKey ? 12 : 1 };
  if (key === "ArrowDown") return { kind: "nudge", steps: 0, semitones: e.shiftKey ? -12 : -1 };
  if (key === "0") return { kind: "resetCents" };
  for (const [tool, k] of Object.entries(TOOL_KEYS) as [PianoRollTool, string][]) if (key === k.toLowerCase() && !e.shiftKey) return { kind: "tool", tool };
  return null;
}

/** True when a key press comes from a text field or a select, whose keys are the field's. */
export function fromField(target: EventTarget | null): boolean {
  if (!target || typeof (target as HTMLElement).tagName !== "string") return false;
  const el = target as HTMLElement;
  const tag = el.tagName;
  if (tag === "TEXTAREA" || tag === "SELECT" || el.isContentEditable) return true;
  if (tag !== "INPUT") return false;
  const type = (el as HTMLInputElement).type;
  return !["checkbox", "radio", "button", "range"].includes(type);
}
