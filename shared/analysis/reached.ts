import { isReached } from '../kinematics/pointReach';

export { isReached };

/**
 * A signed margin (mm) rounded to 0.1 mm for the analysis JSON and display, never across the
 * reached line: a point short by 0.03 mm stays short (−0.1), so every reader that applies
 * `isReached` to the rounded value gets the verdict of the unrounded one.
 */
export function roundMargin(marginMm: number): number {
  const r = Math.round(marginMm * 10) / 10;
  if (!isReached(marginMm)) return r < 0 ? r : -0.1;
  return r === 0 ? 0 : r;
}

/** A shortfall (mm, positive) for a sentence: whole millimetres, one decimal below half a millimetre. */
export function shortfallText(shortMm: number): string {
  return shortMm < 0.5 ? shortMm.toFixed(1) : String(Math.round(shortMm));
}
