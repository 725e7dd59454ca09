// Browser steps for the take page's playback (issue 5): transport, listen modes, loop and audio/playhead drift. Called from run.ts.
import type { TeachingContext } from "./teaching";

export function playbackSteps(_ctx: TeachingContext): [string, () => Promise<void>][] {
  return [];
}
