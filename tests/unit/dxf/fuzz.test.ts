import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import type { ImportResult } from '@shared/schemas/floorPlan';
import { DxfImportError } from '../../../backend/src/services/dxf/errors';
import { importDxf } from '../../../backend/src/services/dxf/importDxf';
import { SAMPLE_FILES } from '../../../samples/make-samples';
import { readSample } from './support';

// FUZZ_RUNS raises the count (`npm run fuzz` uses 20000); the default keeps the suite quick.
const RUNS = Math.max(1, Number(process.env.FUZZ_RUNS ?? 1000) || 1000);
const SAMPLES = Object.values(SAMPLE_FILES).map((f) => readSample(f).split('\n'));

const WORDS = ['0', '2', '5', '8', '10', '20', '30', '42', '70', '90', 'SECTION', 'ENDSEC', 'EOF', 'ENTITIES', 'BLOCKS', 'TABLES',
  'TABLE', 'ENDTAB', 'LAYER', 'VPORT', 'BLOCK', 'ENDBLK', 'INSERT', 'COLUMN', 'POLYLINE', 'VERTEX', 'SEQEND', 'LWPOLYLINE', 'LINE',
  'ARC', 'CIRCLE', 'SPLINE', 'ELLIPSE', 'TEXT', 'MTEXT', 'HATCH', '\u0000', '', '  ', '1e300', 'NaN', 'Infinity', '-1'];

type Op =
  | { kind: 'drop'; at: number; count: number }
  | { kind: 'swapCodes'; a: number; b: number }
  | { kind: 'number'; at: number; value: string }
  | { kind: 'truncate'; at: number }
  | { kind: 'garbage'; at: number; text: string }
  | { kind: 'duplicate'; at: number; count: number };

const numberText = fc.oneof(
  fc.double({ noNaN: false }).map(String),
  fc.integer({ min: -1e9, max: 1e9 }).map(String),
  fc.constantFrom('1e300', '-1e300', 'NaN', 'Infinity', '-Infinity', '-0', '0', '99999999', '-1', '1e-300', '4', '6', '1'),
);

const op: fc.Arbitrary<Op> = fc.oneof(
  fc.record({ kind: fc.constant('drop' as const), at: fc.nat(), count: fc.integer({ min: 1, max: 4 }) }),
  fc.record({ kind: fc.constant('swapCodes' as const), a: fc.nat(), b: fc.nat() }),
  fc.record({ kind: fc.constant('number' as const), at: fc.nat(), value: numberText }),
  fc.record({ kind: fc.constant('truncate' as const), at: fc.nat() }),
  fc.record({ kind: fc.constant('garbage' as const), at: fc.nat(), text: fc.oneof(fc.constantFrom(...WORDS), fc.string({ maxLength: 12 })) }),
  fc.record({ kind: fc.constant('duplicate' as const), at: fc.nat(), count: fc.integer({ min: 1, max: 40 }) }),
);

/** Applies the mutations to a copy of the sample's lines. */
function mutate(lines: readonly string[], ops: readonly Op[]): string {
  let l = [...lines];
  for (const o of ops) {
    const n = Math.max(l.length, 1);
    switch (o.kind) {
      case 'drop':
        l.splice(o.at % n, o.count);
        break;
      case 'swapCodes': {
        const a = (o.a % n) & ~1; // group code lines are the even ones
        const b = (o.b % n) & ~1;
        if (a < l.length && b < l.length) [l[a], l[b]] = [l[b], l[a]];
        break;
      }
      case 'number': {
        // change the value of a numeric group (an odd line holding a number), else any line
        const start = (o.at % n) | 1;
        let i = start;
        while (i < l.length && !/^\s*-?[\d.]+(e-?\d+)?\s*$/i.test(l[i])) i += 2;
        l[i < l.length ? i : o.at % n] = o.value;
        break;
      }
      case 'truncate':
        l = l.slice(0, o.at % n);
        break;
      case 'garbage':
        l.splice(o.at % (n + 1), 0, o.text);
        break;
      case 'duplicate': {
        const at = o.at % n;
        l.splice(at, 0, ...l.slice(at, at + o.count));
        break;
      }
    }
  }
  return l.join('\n');
}

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
      fc.property(fc.nat({ max: SAMPLES.length - 1 }), fc.array(op, { minLength: 1, maxLength: 6 }), (which, ops) => {
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
