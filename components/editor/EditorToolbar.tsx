"use client";
import { useSyncExternalStore } from "react";
import { Button, cx } from "@/components/ui";
import type { PianoRollTool } from "@/components/piano-roll";
import { TOOL_KEYS } from "./shortcuts";

const TOOLS: { tool: PianoRollTool; label: string; hint: string }[] = [
  { tool: "select", label: "Select", hint: "click, shift-click or drag a marquee; drag notes to move them, their ends to stretch" },
  { tool: "draw", label: "Draw", hint: "drag on an empty row to add a note" },
  { tool: "erase", label: "Erase", hint: "click or drag over notes to remove them" },
  { tool: "split", label: "Split", hint: "click a note where it should be cut in two" },
  { tool: "join", label: "Join", hint: "click a note to join it with the next note of the same pitch" },
];

/** Snap choices: beats divided into 1, 2, 3, 4, 6 or 8 steps. */
export const SNAP_SUBDIVISIONS = [1, 2, 3, 4, 6, 8] as const;
const SNAP_LABEL: Record<number, string> = { 1: "Beat", 2: "½ beat", 3: "⅓ beat", 4: "¼ beat", 6: "⅙ beat", 8: "⅛ beat" };

/** The look of the primitives' inputs (components/ui/control-styles), at toolbar height. */
export const compactControl = (extra?: string) =>
  cx(
    "block h-8 rounded-md border border-rule bg-surface px-2 text-sm text-ink shadow-[inset_0_1px_0_0_rgb(29_36_51/0.04)]",
    "placeholder:text-ink-muted/75 transition-colors duration-150 hover:border-ink/30",
    "focus-visible:border-copper focus-visible:outline-2 focus-visible:outline-offset-1",
    "disabled:cursor-not-allowed disabled:bg-paper disabled:text-ink-muted",
    extra,
  );

export type ToolbarProps = {
  tool: PianoRollTool;
  onTool: (tool: PianoRollTool) => void;
  canUndo: boolean;
  canRedo: boolean;
  onUndo: () => void;
  onRedo: () => void;
  hasSelection: boolean;
  canPaste: boolean;
  onCopy: () => void;
  onPaste: () => void;
  onDelete: () => void;
  onResetCents: () => void;
};

const noChange = () => () => {};
/** ⌘ on Apple keyboards, else Ctrl; the server renders "Ctrl", the browser its own after hydration. */
const appleModifier = () => (/Mac|iPhone|iPad/.test(navigator.platform) ? "⌘" : "Ctrl");

/** The editing tools, undo/redo and the clipboard. Listeners do not get it. */
export function EditorToolbar(p: ToolbarProps) {
  const mod = useSyncExternalStore(noChange, appleModifier, () => "Ctrl");
  return (
    <div className="flex flex-wrap items-center gap-x-4 gap-y-2" role="toolbar" aria-label="Piano roll tools">
      <div role="radiogroup" aria-label="Tool" className="flex overflow-hidden rounded-md border border-rule bg-surface shadow-sm">
        {TOOLS.map(({ tool, label, hint }) => (
          <button
            key={tool}
            type="button"
            role="radio"
            aria-checked={p.tool === tool}
            title={`${label} (${TOOL_KEYS[tool]}): ${hint}`}
            onClick={() => p.onTool(tool)}
            className={cx(
              "h-8 border-r border-rule px-3 text-sm last:border-r-0",
              p.tool === tool ? "bg-copper/12 font-medium text-ink shadow-[inset_0_-2px_0_0_var(--tn-copper)]" : "text-ink hover:bg-ink/[0.05]",
            )}
          >
            {label} <kbd className="ml-0.5 font-mono text-xs text-ink-muted">{TOOL_KEYS[tool]}</kbd>
          </button>
        ))}
      </div>

      <div className="flex gap-1">
        <Button size="sm" variant="secondary" onClick={p.onUndo} disabled={!p.canUndo} title={`Undo (${mod}+Z)`}>
          Undo
        </Button>
        <Button size="sm" variant="secondary" onClick={p.onRedo} disabled={!p.canRedo} title={`Redo (Shift+${mod}+Z)`}>
          Redo
        </Button>
      </div>

      <div className="flex gap-1">
        <Button size="sm" variant="ghost" onClick={p.onCopy} disabled={!p.hasSelection} title={`Copy the selection (${mod}+C)`}>
          Copy
        </Button>
        <Button size="sm" variant="ghost" onClick={p.onPaste} disabled={!p.canPaste} title={`Paste at the playhead (${mod}+V)`}>
          Paste
        </Button>
        <Button size="sm" variant="ghost" onClick={p.onDelete} disabled={!p.hasSelection} title="Delete the selection (Delete)">
          Delete
        </Button>
        <Button size="sm" variant="ghost" onClick={p.onResetCents} disabled={!p.hasSelection} title="Set the selection's cents to 0 (key 0)">
          Reset cents
        </Button>
      </div>

    </div>
  );
}

/** Snap to the beat grid: off, or a subdivision of the beat (needs a tempo). */
export function SnapSelect({ value, onChange, hasTempo }: { value: number; onChange: (subdivision: number) => void; hasTempo: boolean }) {
  return (
      <label className="flex items-center gap-2 text-sm">
        <span className="text-ink-muted">Snap</span>
        <select
          aria-label="Snap to grid"
          className={compactControl("w-28")}
          value={hasTempo ? value : 0}
          disabled={!hasTempo}
          title={hasTempo ? undefined : "Set a tempo to snap to beats"}
          onChange={(e) => onChange(Number(e.target.value))}
        >
          <option value={0}>Off</option>
          {SNAP_SUBDIVISIONS.map((s) => (
            <option key={s} value={s}>
              {SNAP_LABEL[s]}
            </option>
          ))}
        </select>
      </label>
  );
}
