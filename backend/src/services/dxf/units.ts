import { UNIT_NAMES, unitToMm, type UnitName } from '@shared/schemas/floorPlan';

export { UNIT_NAMES, unitToMm, type UnitName };

/** The unit a floor plan is read in, and where that choice came from. */
export interface ResolvedUnits {
  units: UnitName;
  unitsSource: 'header' | 'default' | 'chosen';
  insunits: number | null;
  /** Millimetres per drawing unit. */
  mmPerUnit: number;
  /** A sentence for the planner when the unit was not stated by the file. */
  warning?: string;
}

/** Unit of a $INSUNITS code (DXF reference, HEADER section): 1–24, or null for 0 and unknown codes. */
export function unitFromInsunits(code: number): UnitName | null {
  const u = UNIT_NAMES.find((x) => x.insunits === code);
  return u ? u.name : null;
}

/** Label of a unit for sentences ("Inches"). */
export function unitLabel(name: UnitName): string {
  return UNIT_NAMES.find((x) => x.name === name)?.label ?? name;
}

/**
 * Decides the drawing unit: the caller's choice wins, then the file's $INSUNITS; a unitless or
 * missing header means millimetres, with a warning ($MEASUREMENT 0 = imperial drawing is named
 * in the warning, since such files are often in inches).
 */
export function resolveUnits(
  header: Record<string, unknown> | undefined,
  chosen?: UnitName,
): ResolvedUnits {
  const raw = header?.['$INSUNITS'];
  const insunits = typeof raw === 'number' && Number.isFinite(raw) ? raw : null;
  if (chosen !== undefined) {
    return { units: chosen, unitsSource: 'chosen', insunits, mmPerUnit: unitToMm(chosen) };
  }
  const fromHeader = insunits === null ? null : unitFromInsunits(insunits);
  if (fromHeader) {
    return { units: fromHeader, unitsSource: 'header', insunits, mmPerUnit: unitToMm(fromHeader) };
  }
  const imperial = header?.['$MEASUREMENT'] === 0;
  const why =
    insunits === null
      ? 'The file does not say which unit it is drawn in'
      : insunits === 0
        ? 'The file is marked as unitless'
        : `The file names an unknown unit code (${insunits})`;
  const hint = imperial
    ? ' The file is set up as an imperial drawing, so inches or feet are likely: choose the unit if the sizes look wrong.'
    : ' Choose the unit if the sizes look wrong.';
  return {
    units: 'mm',
    unitsSource: 'default',
    insunits,
    mmPerUnit: 1,
    warning: `${why}; it was read as millimetres.${hint}`,
  };
}
