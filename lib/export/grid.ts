/**
 * Quantisation grids written as note values: "1/N" is the N-th of a whole note, so "1/4" is a
 * quarter, "1/16" a sixteenth and "1/12" an eighth-note triplet. N is an integer 1 … 128.
 */

export interface Grid {
  /** The N of "1/N". */
  n: number;
  /** Grid step in quarter notes (4 / N). */
  quarters: number;
}

export function parseGrid(spec: string): Grid {
  const m = /^\s*1\s*\/\s*(\d{1,3})\s*$/.exec(spec);
  const n = m ? Number(m[1]) : NaN;
  if (!Number.isInteger(n) || n < 1 || n > 128) throw new RangeError(`quantize: "${spec}" is not a note value 1/1 … 1/128`);
  return { n, quarters: 4 / n };
}

/**
 * Snaps an interval [onset, offset) (any unit) to multiples of `step`: each end to the nearest grid
 * line; an interval that would shrink to nothing keeps one step, so no note gets zero length.
 */
export function snapInterval(onset: number, offset: number, step: number): [number, number] {
  const on = Math.round(onset / step) * step;
  let off = Math.round(offset / step) * step;
  if (off <= on) off = on + step;
  return [on, off];
}

export function gcd(a: number, b: number): number {
  while (b) [a, b] = [b, a % b];
  return Math.abs(a);
}

export function lcm(a: number, b: number): number {
  return (a / gcd(a, b)) * b;
}
