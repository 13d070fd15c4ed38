import { describe, expect, it } from 'vitest';
import { guessLayerRole, defaultLayerHeight } from '../../../backend/src/services/dxf/layerRoles';
import { resolveUnits, unitFromInsunits, UNIT_NAMES, unitToMm } from '../../../backend/src/services/dxf/units';
import { BUILDING_UNITS, FloorPlanPatch, pickerUnits } from '@shared/schemas/floorPlan';

describe('drawing units', () => {
  it('every $INSUNITS code 1–24 of the DXF reference has one unit, and 0 has none', () => {
    // DXF reference, HEADER section, $INSUNITS: 0 unitless, 1 inches … 24 US survey miles [pub]
    const order = ['in', 'ft', 'mi', 'mm', 'cm', 'm', 'km', 'uin', 'mil', 'yd', 'angstrom', 'nm', 'um', 'dm', 'dam', 'hm', 'Gm', 'au', 'ly', 'pc', 'us-ft', 'us-in', 'us-yd', 'us-mi'];
    expect(order.map((_, i) => unitFromInsunits(i + 1))).toEqual(order);
    expect(unitFromInsunits(0)).toBeNull();
    expect(unitFromInsunits(25)).toBeNull();
    expect(new Set(UNIT_NAMES.map((u) => u.name)).size).toBe(24);
  });

  it('factors to millimetres are the defined values', () => {
    // International inch 25.4 mm, foot 0.3048 m, yard 0.9144 m, mile 1609.344 m (1959 agreement;
    // NIST SP 811) [pub]; US survey foot 1200/3937 m (NIST) [pub]; au 149 597 870 700 m (IAU 2012
    // B2) [pub]; light-year = 365.25 d × 86 400 s × 299 792 458 m/s [pub, derived]; parsec =
    // 648 000/π au (IAU 2015 B2) [pub].
    expect(unitToMm('in')).toBe(25.4);
    expect(unitToMm('ft')).toBe(304.8);
    expect(unitToMm('yd')).toBe(914.4);
    expect(unitToMm('mi')).toBe(1_609_344);
    expect(unitToMm('mil')).toBeCloseTo(0.0254, 15);
    expect(unitToMm('uin')).toBeCloseTo(0.0000254, 18);
    expect(unitToMm('m')).toBe(1000);
    expect(unitToMm('km')).toBe(1e6);
    expect(unitToMm('cm')).toBe(10);
    expect(unitToMm('dm')).toBe(100);
    expect(unitToMm('dam')).toBe(1e4);
    expect(unitToMm('hm')).toBe(1e5);
    expect(unitToMm('Gm')).toBe(1e12);
    expect(unitToMm('um')).toBeCloseTo(1e-3, 18);
    expect(unitToMm('nm')).toBeCloseTo(1e-6, 20);
    expect(unitToMm('angstrom')).toBeCloseTo(1e-7, 20);
    expect(unitToMm('us-ft')).toBeCloseTo(304.8006096012192, 10);
    expect(unitToMm('us-in') * 12).toBeCloseTo(unitToMm('us-ft'), 10);
    expect(unitToMm('us-yd')).toBeCloseTo(3 * unitToMm('us-ft'), 9);
    expect(unitToMm('us-mi')).toBeCloseTo(5280 * unitToMm('us-ft'), 6);
    expect(unitToMm('au')).toBe(149_597_870_700_000);
    expect(unitToMm('ly')).toBe(365.25 * 86_400 * 299_792_458 * 1000);
    expect(unitToMm('pc') / unitToMm('au')).toBeCloseTo(648_000 / Math.PI, 6);
  });

  it('a unitless or missing header means millimetres with a warning; a chosen unit wins', () => {
    expect(resolveUnits({ $INSUNITS: 0 })).toMatchObject({ units: 'mm', unitsSource: 'default', insunits: 0 });
    expect(resolveUnits({})).toMatchObject({ units: 'mm', unitsSource: 'default', insunits: null });
    expect(resolveUnits({}).warning).toMatch(/read as millimetres/);
    expect(resolveUnits({ $INSUNITS: 0, $MEASUREMENT: 0 }).warning).toMatch(/imperial/);
    expect(resolveUnits({ $INSUNITS: 99 }).warning).toMatch(/unknown unit code \(99\)/);
    expect(resolveUnits({ $INSUNITS: 1 })).toMatchObject({ units: 'in', unitsSource: 'header', mmPerUnit: 25.4 });
    expect(resolveUnits({ $INSUNITS: 1 }, 'm')).toMatchObject({ units: 'm', unitsSource: 'chosen', mmPerUnit: 1000 });
  });
});

describe('layer roles', () => {
  it.each([
    ['OUTLINE', 'outline'], ['Floor Boundary', 'outline'], ['A-FLOOR', 'outline'],
    ['WALLS', 'wall'], ['A-WALL-INT', 'wall'], ['PARTITIONWALL', 'wall'],
    ['COLUMNS', 'column'], ['S-COL', 'column'], ['COL2', 'column'], ['Pillars', 'column'],
    ['MACHINES', 'obstacle'], ['M-EQUIP', 'obstacle'], ['OBST', 'obstacle'],
    ['TEXT', 'ignore'], ['DIMENSIONS', 'ignore'], ['ANNO-NOTES', 'ignore'], ['HATCH', 'ignore'], ['DEFPOINTS', 'ignore'],
    ['WALL-HATCH', 'ignore'], ['COLOR-KEY', 'obstacle'], ['0', 'obstacle'],
  ])('%s → %s', (name, role) => {
    expect(guessLayerRole(name)).toBe(role);
  });

  it('walls and columns default to full height, obstacles to 1500 mm, and the patch schema takes them', () => {
    expect(defaultLayerHeight('wall')).toBeNull();
    expect(defaultLayerHeight('column')).toBeNull();
    expect(defaultLayerHeight('obstacle')).toBe(1500);
    expect(FloorPlanPatch.safeParse({ layers: [{ name: 'MACH', role: 'obstacle', height: 2200 }], units: 'in' }).success).toBe(true);
    expect(FloorPlanPatch.safeParse({}).success).toBe(false);
    expect(FloorPlanPatch.safeParse({ units: 'furlong' }).success).toBe(false);
    expect(FloorPlanPatch.safeParse({ layers: [{ name: 'A', height: -5 }] }).success).toBe(false);
    expect(FloorPlanPatch.safeParse({ layers: [{ name: 'A' }, { name: 'A' }] }).success).toBe(false);
  });
});

describe('the unit picker', () => {
  it('offers the units building drawings are made in, not astronomical or microscopic ones', () => {
    // Building drawings are dimensioned in mm, cm or m (metric practice) or in inches, feet and yards
    // (US/UK practice) — common practice.
    const offered = pickerUnits('mm').map((u) => u.name);
    expect(offered).toEqual(['mm', 'cm', 'dm', 'm', 'in', 'ft', 'yd', 'us-ft', 'us-in']);
    for (const odd of ['ly', 'pc', 'au', 'Gm', 'angstrom', 'nm', 'um', 'uin', 'mi', 'km']) expect(offered).not.toContain(odd);
  });

  it('keeps the unit a file header named visible even when it is not a building unit', () => {
    const offered = pickerUnits('km').map((u) => u.name);
    expect(offered.at(-1)).toBe('km');
    expect(offered).toHaveLength(BUILDING_UNITS.length + 1);
  });
});
