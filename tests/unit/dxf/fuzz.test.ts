import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { ImportResult } from '@shared/schemas/floorPlan';
import { DxfImportError } from '../../../backend/src/services/dxf/errors';
import { importDxf } from '../../../backend/src/services/dxf/importDxf';
import { SAMPLE_FILES } from '../../../samples/make-samples';
import { mutate, mutation, readSample, WORDS } from './support';

// FUZZ_RUNS raises the count (`npm run fuzz` uses 20000); the default keeps the suite quick.
const RUNS = Math.max(1, Number(process.env.FUZZ_RUNS ?? 1000) || 1000);
const SAMPLES = Object.values(SAMPLE_FILES).map((f) => readSample(f).split('\n'));

/** Every number anywhere in the result is finite (JSON would hide NaN as null). */
function assertAllFinite(value: unknown, path = 'result'): void {
  if (typeof value === 'number') {
    if (!Number.isFinite(value)) throw new Error(`${path} is ${value}`);
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => assertAllFinite(v, `${path}[${i}]`));
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) assertAllFinite(v, `${path}.${k}`);
  }
}

function checkOutcome(text: string | Uint8Array): void {
  let result: ImportResult;
  try {
    result = importDxf(text);
  } catch (e) {
    if (e instanceof DxfImportError) return;
    throw e; // any other exception fails the property
  }
  assertAllFinite(result);
  const b = result.bounds;
  expect(b.minX <= b.maxX && b.minY <= b.maxY).toBe(true);
  expect(result.geometry.features.length).toBeGreaterThan(0);
  for (const f of result.geometry.features) {
    const g = f.geometry;
    const pts = g.type === 'Point' ? [g.coordinates] : g.type === 'LineString' ? g.coordinates : g.type === 'Polygon' ? g.coordinates.flat() : [];
    for (const [x, y] of pts) expect(x >= b.minX && x <= b.maxX && y >= b.minY && y <= b.maxY).toBe(true);
  }
}

describe('fuzzing the import with damaged sample files', () => {
  it(`mutated samples give a valid result or a DxfImportError, never another exception (${RUNS} runs)`, () => {
    fc.assert(
      fc.property(fc.nat({ max: SAMPLES.length - 1 }), fc.array(mutation, { minLength: 1, maxLength: 6 }), (which, ops) => {
        checkOutcome(mutate(SAMPLES[which], ops));
      }),
      { numRuns: RUNS },
    );
  }, 600_000);

  it(`arbitrary text and bytes give a valid result or a DxfImportError (${Math.ceil(RUNS / 4)} runs)`, () => {
    fc.assert(
      fc.property(
        fc.oneof(
          fc.string({ maxLength: 400 }),
          fc.uint8Array({ maxLength: 400 }),
          fc.array(fc.constantFrom(...WORDS), { maxLength: 120 }).map((w) => w.join('\n')),
        ),
        (input) => checkOutcome(input),
      ),
      { numRuns: Math.ceil(RUNS / 4) },
    );
  }, 600_000);

  it('the unmutated samples pass the same check (the property can tell a good file)', () => {
    for (const lines of SAMPLES) {
      const r = importDxf(lines.join('\n'));
      assertAllFinite(r);
      expect(r.geometry.features.length).toBeGreaterThan(10);
    }
  });
});
