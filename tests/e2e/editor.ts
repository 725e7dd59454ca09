// Browser steps for the take page's editor (issue 5): editing, saving revisions, undo, conflicts, listeners read-only. Called from run.ts.
import type { TeachingContext } from "./teaching";

export function editorSteps(_ctx: TeachingContext): [string, () => Promise<void>][] {
  return [];
}
