import type { SnapGrid } from "./types";

/** Length of one grid step in seconds: 60 / tempoBpm / subdivision; null when snapping is off. */
export function gridStepSec(grid: SnapGrid): number | null {
  if (grid.kind === "off") return null;
  if (!(grid.tempoBpm > 0) || !(grid.subdivision > 0)) return null;
  return 60 / grid.tempoBpm / grid.subdivision;
}

/** The nearest grid line to `timeSec` (never below 0); the time itself when snapping is off. */
export function snapTime(timeSec: number, grid: SnapGrid): number {
  const step = gridStepSec(grid);
  if (step === null) return Math.max(0, timeSec);
  // round away float noise so that 3 × (1/8 s) is exactly 0.375
  return Math.max(0, Number((Math.round(timeSec / step) * step).toFixed(9)));
}
