/**
 * Scale bar and grid steps: lengths from the 1-2-5 series (0.1, 0.2, 0.5, 1, 2, 5, 10, 20, 50 m
 * and on), the round numbers drawings use for scale bars and grids.
 */

/** The 1-2-5 series of step lengths, mm, from 1 mm to 500 km. */
export const NICE_STEPS_MM: readonly number[] = (() => {
  const out: number[] = [];
  for (let exp = 0; exp <= 5; exp += 1) for (const m of [1, 2, 5]) out.push(m * 10 ** exp);
  return out;
})();

/** The scale bar's steps: the 1-2-5 series from 0.1 m, mm. */
export const SCALE_BAR_STEPS_MM: readonly number[] = NICE_STEPS_MM.filter((s) => s >= 100);

/** A scale bar: its length in plan mm, in screen px, and its label in metres. */
export interface ScaleBar {
  mm: number;
  px: number;
  label: string;
}

/** "0.5 m", "1 m", "20 m" — a step length in mm written in metres. */
export function formatMetres(mm: number): string {
  const m = mm / 1000;
  const text = m >= 1 ? String(Math.round(m)) : String(Number(m.toPrecision(3)));
  return `${text} m`;
}

/**
 * The longest step of `steps` (mm) that is at most `maxPx` long at `pxPerMm`; the shortest step
 * when even that is longer.
 */
export function niceStepAtMost(pxPerMm: number, maxPx: number, steps: readonly number[] = NICE_STEPS_MM): number {
  if (!(pxPerMm > 0) || !Number.isFinite(pxPerMm)) throw new RangeError('pxPerMm: must be a positive finite scale');
  if (!(maxPx > 0)) throw new RangeError('maxPx: must be positive');
  let best = steps[0];
  for (const s of steps) if (s * pxPerMm <= maxPx) best = s;
  return best;
}

/**
 * The shortest step of `steps` (mm) that is at least `minPx` long at `pxPerMm`; the longest step
 * when none is (for grid spacing that never gets denser than `minPx`).
 */
export function niceStepAtLeast(pxPerMm: number, minPx: number, steps: readonly number[] = NICE_STEPS_MM): number {
  if (!(pxPerMm > 0) || !Number.isFinite(pxPerMm)) throw new RangeError('pxPerMm: must be a positive finite scale');
  if (!(minPx > 0)) throw new RangeError('minPx: must be positive');
  for (const s of steps) if (s * pxPerMm >= minPx) return s;
  return steps[steps.length - 1];
}

/** The scale bar for `pxPerMm` (screen px per plan mm) no longer than `maxPx`, in metres. */
export function scaleBarFor(pxPerMm: number, maxPx = 120): ScaleBar {
  const mm = niceStepAtMost(pxPerMm, maxPx, SCALE_BAR_STEPS_MM);
  return { mm, px: mm * pxPerMm, label: formatMetres(mm) };
}
