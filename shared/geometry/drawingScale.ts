import { UNIT_NAMES, type UnitName } from '../schemas/floorPlan';

/**
 * Smallest and largest plausible extent of a building floor, mm (about 2 m … 5 km): a kiosk to a
 * large works site. Common practice, not a standard; a drawing outside it is most likely read in
 * the wrong unit.
 */
export const PLAUSIBLE_EXTENT_MM = { min: 2_000, max: 5_000_000 } as const;

/** Units a building drawing is made in, tried in this order when the read one is implausible. */
const BUILDING_UNITS: readonly UnitName[] = ['mm', 'cm', 'm', 'in', 'ft'];

/** A typical floor extent, mm (50 m): among plausible units, the one closest to it in ratio wins. */
const TYPICAL_EXTENT_MM = 50_000;

/** Whether a drawing's extent is plausible for a building floor in the unit it was read in. */
export interface UnitCheck {
  plausible: boolean;
  /** Larger side of the drawing's extent as read, mm. */
  extentMm: number;
  /** A unit in which the extent would be plausible (only when it is not). */
  suggestion: { units: UnitName; extentMm: number } | null;
  /** One sentence for the planner (only when the extent is not plausible). */
  message: string | null;
}

function unitMm(u: UnitName): number {
  return UNIT_NAMES.find((x) => x.name === u)?.mm ?? 1;
}

function unitWords(u: UnitName): string {
  return (UNIT_NAMES.find((x) => x.name === u)?.label ?? u).toLowerCase();
}

/** A length in mm as a short reading ("0.87 m", "22 m", "42 mm", "3.1 km"). */
export function lengthText(mm: number): string {
  const a = Math.abs(mm);
  const fix = (v: number) => (Math.abs(v) >= 10 ? v.toFixed(0) : Math.abs(v) >= 1 ? v.toFixed(1) : v.toFixed(2));
  if (a >= 1_000_000) return `${fix(mm / 1_000_000)} km`;
  if (a >= 100) return `${fix(mm / 1000)} m`;
  if (a >= 10) return `${mm.toFixed(0)} mm`;
  return `${mm.toPrecision(2)} mm`;
}

/**
 * Checks the extent of a drawing read in `units` (bounds in plan mm) against
 * PLAUSIBLE_EXTENT_MM; when it fails, names the building unit that would make it plausible
 * (closest to a typical 50 m floor by ratio).
 */
export function checkDrawingUnit(bounds: { minX: number; minY: number; maxX: number; maxY: number }, units: UnitName): UnitCheck {
  const w = bounds.maxX - bounds.minX;
  const h = bounds.maxY - bounds.minY;
  const extentMm = Math.max(w, h);
  if (!Number.isFinite(extentMm) || extentMm <= 0) return { plausible: true, extentMm: 0, suggestion: null, message: null };
  const fits = (mm: number) => mm >= PLAUSIBLE_EXTENT_MM.min && mm <= PLAUSIBLE_EXTENT_MM.max;
  if (fits(extentMm)) return { plausible: true, extentMm, suggestion: null, message: null };
  const inUnits = extentMm / unitMm(units);
  let best: { units: UnitName; extentMm: number } | null = null;
  let bestScore = Number.POSITIVE_INFINITY;
  for (const u of BUILDING_UNITS) {
    if (u === units) continue;
    const mm = inUnits * unitMm(u);
    if (!fits(mm)) continue;
    const score = Math.abs(Math.log(mm / TYPICAL_EXTENT_MM));
    if (score < bestScore) {
      bestScore = score;
      best = { units: u, extentMm: mm };
    }
  }
  const side = w >= h ? 'wide' : 'long';
  const read = `This drawing is ${lengthText(extentMm)} ${side} read in ${unitWords(units)}`;
  const size = extentMm < PLAUSIBLE_EXTENT_MM.min ? 'small' : 'large';
  const message = best
    ? `${read}, too ${size} for a building floor; in ${unitWords(best.units)} it would be ${lengthText(best.extentMm)}. Check the drawing unit.`
    : `${read}, too ${size} for a building floor, and no usual drawing unit makes it plausible. Check the drawing.`;
  return { plausible: false, extentMm, suggestion: best, message };
}
