import { readdirSync, statSync } from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { FloorPlanPatch } from '@shared/schemas/floorPlan';
import { importDxf } from '../../../backend/src/services/dxf/importDxf';
import { fernhillHall, HALL_CORNER_RADIUS, SAMPLE_FILES, type HallVariant } from '../../../samples/make-samples';
import { d3Area, linesOn, polygonsOn, readSample, SAMPLES_DIR, shoelace } from './support';

/** Layer → entity count every variant holds (see samples/floor-plans/README.md). */
const EXPECTED_LAYERS: Record<string, [string, number]> = {
  OUTLINE: ['outline', 1],
  WALLS: ['wall', 5],
  DOORS: ['ignore', 2],
  COLUMNS: ['column', 6],
  MACHINES: ['obstacle', 5],
  TEXT: ['ignore', 4],
};

const centre = (ring: number[][]) => {
  const pts = ring.slice(0, -1);
  return [pts.reduce((s, p) => s + p[0], 0) / pts.length, pts.reduce((s, p) => s + p[1], 0) / pts.length];
};

describe('sample floor plans', () => {
  const variants = Object.entries(SAMPLE_FILES) as Array<[HallVariant, string]>;

  it('every .dxf in samples/floor-plans is one the generator writes, byte for byte, and under 300 KB', () => {
    const files = readdirSync(SAMPLES_DIR).filter((f) => f.endsWith('.dxf')).sort();
    expect(files).toEqual(Object.values(SAMPLE_FILES).sort());
    for (const [variant, file] of variants) {
      expect(readSample(file)).toBe(fernhillHall(variant));
      expect(statSync(path.join(SAMPLES_DIR, file)).size).toBeLessThan(300 * 1024);
    }
  });

  it.each(variants)('%s imports with the expected layers, roles and counts', (_variant, file) => {
    const r = importDxf(readSample(file));
    const got = Object.fromEntries(r.layers.map((l) => [l.name, [l.role, l.entityCount]]));
    expect(got).toEqual(EXPECTED_LAYERS);
    expect(r.stats.entities).toBe(23);
    expect(r.bounds).toEqual({ minX: 0, minY: 0, maxX: 24000, maxY: 16000 });
    // the layer choices the API accepts (same schema as the PATCH route)
    expect(FloorPlanPatch.safeParse({ layers: r.layers.map(({ name, role, height }) => ({ name, role, height })) }).success).toBe(true);
  });

  it('columns stand on the 8 m grid and the rotated machine inserts land where the README says', () => {
    const r = importDxf(readSample('fernhill-hall.dxf'));
    const cols = polygonsOn(r, 'COLUMNS').map((ring) => centre(ring).join(',')).sort();
    expect(cols).toEqual(['12000,12000', '12000,4000', '20000,12000', '20000,4000', '4000,12000', '4000,4000']);
    for (const ring of polygonsOn(r, 'COLUMNS')) expect(d3Area(ring)).toBeCloseTo(160000, 6); // 400 × 400 mm
    // infeed frame (base point (1000,500), turned 180° about (16000,7000)): x 10000…16000, y 5800…7000
    const frames = polygonsOn(r, 'MACHINES').map((ring) => {
      const xs = ring.map((p) => p[0]);
      const ys = ring.map((p) => p[1]);
      return [Math.min(...xs), Math.min(...ys), Math.max(...xs), Math.max(...ys)].join(',');
    });
    expect(frames).toContain('10000,5800,16000,7000');
    expect(frames).toContain('17200,2000,19000,4500');
    expect(frames).toContain('17550,4500,18650,5100');
    expect(linesOn(r, 'MACHINES')).toEqual([[[16000, 6400], [10000, 6400]]]);
    const labels = r.geometry.features.filter((f) => f.geometry.type === 'Point').map((f) => f.properties);
    expect(labels.find((p) => p.text === 'CASE ERECTOR')).toMatchObject({ rotation: 90, textHeight: 200 });
    expect(labels.find((p) => p.entity === 'MTEXT')?.text).toBe('Office\nStore');
    expect(r.notes.ignored).toContain('1 HATCH entity was skipped (not supported).');
    expect(r.stats.skipped).toEqual({ 'HATCH (not supported)': 1 });
  });

  it('the inch drawing gives the same millimetres as the millimetre drawing', () => {
    const mm = importDxf(readSample('fernhill-hall.dxf'));
    const inch = importDxf(readSample('fernhill-hall-inches.dxf'));
    expect(inch.units).toBe('in');
    expect(inch.insunits).toBe(1);
    expect(inch.geometry.features).toHaveLength(mm.geometry.features.length);
    const flat = (r: typeof mm) => JSON.stringify(r.geometry.features.map((f) => f.geometry)).match(/-?\d+(\.\d+)?(e-?\d+)?/g)!.map(Number);
    const a = flat(mm);
    const b = flat(inch);
    expect(b).toHaveLength(a.length);
    // written to 10 decimals of an inch: within 1e-8 in = 2.54e-7 mm, then rounded to 1e-6 mm
    for (let i = 0; i < a.length; i++) expect(Math.abs(a[i] - b[i])).toBeLessThanOrEqual(1.1e-6);
  });

  it('the R12 drawing uses POLYLINE/VERTEX/SEQEND and, having no $INSUNITS, is read as millimetres with a warning', () => {
    const text = readSample('fernhill-hall-r12.dxf');
    expect(text).toContain('AC1009');
    expect(text).not.toContain('LWPOLYLINE');
    expect(text).toContain('SEQEND');
    const r = importDxf(text);
    expect(r.unitsSource).toBe('default');
    expect(r.insunits).toBeNull();
    expect(r.warnings[0]).toMatch(/does not say which unit.*read as millimetres/);
    const [outline] = polygonsOn(r, 'OUTLINE');
    expect(shoelace(outline)).toBeCloseTo(375e6, 6);
  });

  it('the rounded outline has the area of its fillets within the chord tolerance', () => {
    // Each 90° fillet of radius r removes (convex corner) or adds (concave corner) r²(1 − π/4)
    // [derived from the square and quarter-circle areas]; the hall has 5 convex corners and 1
    // concave, so A = 375 m² − 4·r²(1 − π/4). Chords lose at most tol × arc length (6 quarter arcs).
    const r0 = HALL_CORNER_RADIUS;
    const exact = 375e6 - 4 * r0 * r0 * (1 - Math.PI / 4);
    const res = importDxf(readSample('fernhill-hall-rounded.dxf'), { chordToleranceMm: 1 });
    const [outline] = polygonsOn(res, 'OUTLINE');
    const arcLength = 6 * (Math.PI / 2) * r0;
    expect(Math.abs(d3Area(outline) - exact)).toBeLessThanOrEqual(1 * arcLength);
    // finer chords come closer
    const fine = polygonsOn(importDxf(readSample('fernhill-hall-rounded.dxf'), { chordToleranceMm: 0.05 }), 'OUTLINE')[0];
    expect(Math.abs(d3Area(fine) - exact)).toBeLessThan(Math.abs(d3Area(outline) - exact));
    expect(Math.abs(d3Area(fine) - exact)).toBeLessThanOrEqual(0.05 * arcLength);
    expect(res.warnings.some((w) => /crosses itself|no closed outline/.test(w))).toBe(false);
  });
});
