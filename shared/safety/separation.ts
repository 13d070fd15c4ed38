/**
 * Separation distance of a safeguard on an opening (ISO 13855): the minimum distance S (mm)
 * between the detection boundary (or the guard) and the hazard, so that a person approaching at a
 * standard speed cannot reach the hazard before the machine has stopped.
 *
 *   S = K·T + C,  T = device response time + the machine's stopping time (s)
 *
 * K is the approach speed (mm/s) and C an intrusion allowance (mm) that depends on the device:
 * - light curtain, normal approach, resolution d ≤ 40 mm: C = 8(d − 14); S with K = 2000 mm/s,
 *   never below 100 mm; if that gives more than 500 mm, recompute with K = 1600 mm/s and never go
 *   below 500 mm;
 * - light curtain with d > 40 mm and multi-beam devices: S = 1600·T + 850;
 * - single beam: S = 1600·T + 1200;
 * - parallel approach (a horizontal detection boundary at height H above the floor):
 *   S = 1600·T + (1200 − 0.4·H), with H ≤ 1000 mm and H ≥ 15(d − 50), and C never below 850 mm;
 * - interlocked guard without guard locking: S = 1600·T (T from the guard starting to open);
 * - interlocked guard with guard locking: the guard stays shut until the hazard has stopped, so
 *   no separation distance is needed.
 * These are planning values; the distances must be verified with the maker's measured stopping
 * data and the installed devices by a competent person.
 */

export const SAFEGUARD_DEVICES = ['interlock', 'interlock-locking', 'light-curtain', 'multi-beam', 'single-beam'] as const;
export type SafeguardDevice = (typeof SAFEGUARD_DEVICES)[number];
export type Approach = 'normal' | 'parallel';

/** What ISO 13855's formula needs of a safeguard and of the arm behind it. */
export interface SeparationInput {
  device: SafeguardDevice;
  /** Detection capability d of a light curtain, mm. */
  resolutionMm?: number;
  /** Number of beams of a multi-beam device. */
  beams?: number;
  approach?: Approach;
  /** Height of a parallel (horizontal) detection boundary above the floor, mm. */
  heightMm?: number;
  /** Response time of the device, s. */
  responseTimeS: number;
  /** Stopping time of the arm for the stop category used, s. */
  stopTimeS: number;
}

/** The separation distance and how it was found. */
export interface Separation {
  /** Required separation distance S, mm (0 where none is needed). */
  sMm: number;
  /** Approach speed K used, mm/s (0 where none is needed). */
  kMmPerS: number;
  /** Intrusion allowance C used, mm. */
  cMm: number;
  /** Total time T = response + stopping, s. */
  tS: number;
  /** The formula with its numbers, for a sheet or a tooltip. */
  formula: string;
}

/** Bad input to a safeguarding formula: names the field it is about. */
export class SafeguardInputError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(message);
    this.name = 'SafeguardInputError';
  }
}

const K_FAST = 2000;
const K_WALK = 1600;
const fmt = (v: number) => String(Math.round(v * 1000) / 1000);

function time(field: string, v: number | undefined, label: string): number {
  if (v === undefined || v === null || !Number.isFinite(v)) throw new SafeguardInputError(field, `${label} is required (seconds).`);
  if (v < 0) throw new SafeguardInputError(field, `${label} cannot be negative.`);
  if (v > 30) throw new SafeguardInputError(field, `${label} of ${v} s is not plausible (more than 30 s).`);
  return v;
}

function result(k: number, t: number, c: number, s: number, formula: string): Separation {
  return { sMm: Math.round(s * 10) / 10, kMmPerS: k, cMm: Math.round(c * 10) / 10, tS: t, formula };
}

/** Parallel approach (horizontal detection boundary): S = 1600·T + (1200 − 0.4·H), C ≥ 850 mm, H ≤ 1000 mm and ≥ 15(d − 50). */
function parallel(t: number, input: SeparationInput): Separation {
  const h = input.heightMm;
  if (h === undefined || !Number.isFinite(h)) throw new SafeguardInputError('heightMm', 'Height of the detection boundary above the floor is required for a parallel approach (mm).');
  if (h < 0) throw new SafeguardInputError('heightMm', 'Height of the detection boundary cannot be negative.');
  if (h > 1000) throw new SafeguardInputError('heightMm', `A parallel detection boundary at ${h} mm is above the 1000 mm that ISO 13855 allows; lower it.`);
  const d = input.resolutionMm;
  if (d !== undefined && Number.isFinite(d) && h < 15 * (d - 50)) {
    throw new SafeguardInputError('heightMm', `With a resolution of ${d} mm the detection boundary must be at least ${fmt(15 * (d - 50))} mm above the floor (15·(d − 50)).`);
  }
  const c = Math.max(850, 1200 - 0.4 * h);
  const s = K_WALK * t + c;
  return result(K_WALK, t, c, s, `S = 1600 mm/s × ${fmt(t)} s + max(850, 1200 − 0.4 × ${fmt(h)}) mm = ${fmt(s)} mm`);
}

/** Light curtain approached normal to its plane (ISO 13855 K/C rules by resolution). */
function curtain(t: number, input: SeparationInput): Separation {
  const d = input.resolutionMm;
  if (d === undefined || !Number.isFinite(d)) throw new SafeguardInputError('resolutionMm', 'Resolution of the light curtain is required (mm).');
  if (d <= 0 || d > 300) throw new SafeguardInputError('resolutionMm', `A resolution of ${d} mm is not plausible for a light curtain.`);
  if (d > 40) {
    const s = K_WALK * t + 850;
    return result(K_WALK, t, 850, s, `S = 1600 mm/s × ${fmt(t)} s + 850 mm = ${fmt(s)} mm (resolution above 40 mm)`);
  }
  // C is not taken below 0 for resolutions finer than 14 mm (value from memory of the standard's text).
  const c = Math.max(0, 8 * (d - 14));
  const fast = K_FAST * t + c;
  if (fast <= 500) {
    const s = Math.max(100, fast);
    return result(K_FAST, t, c, s, `S = 2000 mm/s × ${fmt(t)} s + 8 × (${fmt(d)} − 14) mm = ${fmt(fast)} mm${s > fast ? ', at least 100 mm' : ''}`);
  }
  const slow = K_WALK * t + c;
  const s = Math.max(500, slow);
  return result(K_WALK, t, c, s, `S = 2000 mm/s × ${fmt(t)} s + ${fmt(c)} mm = ${fmt(fast)} mm > 500 mm, so S = 1600 mm/s × ${fmt(t)} s + ${fmt(c)} mm = ${fmt(slow)} mm${s > slow ? ', at least 500 mm' : ''}`);
}

/** ISO 13855 separation distance S (mm) for a safeguard (see the file comment for the rules). */
export function separationDistance(input: Readonly<SeparationInput>): Separation {
  if (!SAFEGUARD_DEVICES.includes(input.device)) throw new SafeguardInputError('device', `Safeguard device must be one of ${SAFEGUARD_DEVICES.join(', ')}.`);
  const approach = input.approach ?? 'normal';
  if (approach !== 'normal' && approach !== 'parallel') throw new SafeguardInputError('approach', 'Approach must be normal or parallel.');
  const t = time('responseTimeS', input.responseTimeS, 'Response time of the device') + time('stopTimeS', input.stopTimeS, 'Stopping time of the arm');
  switch (input.device) {
    case 'interlock-locking':
      return result(0, t, 0, 0, 'Interlocked guard with guard locking: the guard stays shut until the arm has stopped, so no separation distance is needed');
    case 'interlock': {
      const s = K_WALK * t;
      return result(K_WALK, t, 0, s, `S = 1600 mm/s × ${fmt(t)} s = ${fmt(s)} mm (interlocked guard without guard locking)`);
    }
    case 'single-beam': {
      if (approach === 'parallel') throw new SafeguardInputError('approach', 'A single beam is approached normal to it; a parallel approach applies to light curtains.');
      const s = K_WALK * t + 1200;
      return result(K_WALK, t, 1200, s, `S = 1600 mm/s × ${fmt(t)} s + 1200 mm = ${fmt(s)} mm (single beam)`);
    }
    case 'multi-beam': {
      if (approach === 'parallel') throw new SafeguardInputError('approach', 'A multi-beam device is approached normal to it; a parallel approach applies to light curtains.');
      const n = input.beams;
      if (n !== undefined && (!Number.isInteger(n) || n < 2 || n > 8)) throw new SafeguardInputError('beams', 'A multi-beam device has 2 to 8 beams.');
      const s = K_WALK * t + 850;
      return result(K_WALK, t, 850, s, `S = 1600 mm/s × ${fmt(t)} s + 850 mm = ${fmt(s)} mm (multi-beam${n ? `, ${n} beams` : ''})`);
    }
    case 'light-curtain':
      return approach === 'parallel' ? parallel(t, input) : curtain(t, input);
  }
}

/** Beam heights above the floor (mm) that ISO 13855 recommends for a multi-beam device, or null for other counts. */
export function recommendedBeamHeights(beams: number): number[] | null {
  const table: Record<number, number[]> = { 2: [400, 900], 3: [300, 700, 1100], 4: [300, 600, 900, 1200] };
  return table[beams] ?? null;
}
