// The geometry's JSON text written straight from the packed arrays (packedGeometryJson) against
// JSON.stringify itself (the ECMAScript serializer, the outside check): uploads store that text,
// where they stored JSON.stringify of the rebuilt GeoJSON before.
import { readdirSync } from 'node:fs';
import fc from 'fast-check';
import type { Feature, Geometry, Position } from 'geojson';
import { describe, expect, it } from 'vitest';
import type { ImportResult, PlanFeatureProps } from '@shared/schemas/floorPlan';
import { importDxf } from '../../../backend/src/services/dxf/importDxf';
import { parseInWorker, parseInWorkerPacked } from '../../../backend/src/services/dxf/parseInWorker';
import { packedGeometryJson, packResult, unpackResult } from '../../../backend/src/services/dxf/transfer';
import { readSample, SAMPLES_DIR } from './support';

// numbers JSON.stringify writes in each of its forms: integers, fractions, exponents both ways,
// -0 (written 0), the largest and smallest doubles, and non-finite ones (written null)
const num = fc.oneof(
  fc.double(),
  fc.integer({ min: -1e9, max: 1e9 }),
  fc.integer({ min: -1e10, max: 1e10 }).map((k) => k / 10),
  fc.constantFrom(-0, 0, 1e21, -1e21, 1e-7, 5e-324, Number.MAX_VALUE, 123456789012345680000),
);
const position = fc.tuple(num, num).map(([x, y]): Position => [x, y]);
// names with quotes, backslashes, control characters, non-ASCII and lone surrogates
const name = fc.oneof(fc.string(), fc.string({ unit: 'grapheme' }), fc.string({ unit: 'binary' }), fc.constantFrom('0', 'A"B\\C', '\u2028\n\t\u0000', '\ud800'));

const props: fc.Arbitrary<PlanFeatureProps> = fc
  .record(
    {
      layer: name,
      entity: fc.oneof(fc.constantFrom('LINE', 'LWPOLYLINE', 'JOINED', 'TEXT'), name),
      closed: fc.boolean(),
      text: name,
      textHeight: num,
      rotation: num,
      parts: fc.integer({ min: 1, max: 1000 }),
    },
    { requiredKeys: ['layer', 'entity', 'closed'] },
  )
  // in the order unpackResult gives them
  .map((r) => {
    const p: PlanFeatureProps = { layer: r.layer, entity: r.entity, closed: r.closed };
    if (r.text !== undefined) p.text = r.text;
    if (r.textHeight !== undefined) p.textHeight = r.textHeight;
    if (r.rotation !== undefined) p.rotation = r.rotation;
    if (r.parts !== undefined) p.parts = r.parts;
    return p;
  });

const geometry: fc.Arbitrary<Geometry> = fc.oneof(
  position.map((coordinates): Geometry => ({ type: 'Point', coordinates })),
  fc.array(position, { maxLength: 8 }).map((coordinates): Geometry => ({ type: 'LineString', coordinates })),
  fc.array(fc.array(position, { maxLength: 6 }), { maxLength: 4 }).map((coordinates): Geometry => ({ type: 'Polygon', coordinates })),
);

const feature = fc
  .tuple(props, geometry)
  .map(([properties, g]): Feature<Geometry, PlanFeatureProps> => ({ type: 'Feature', properties, geometry: g }));

function resultOf(features: Array<Feature<Geometry, PlanFeatureProps>>): ImportResult {
  const r = importDxf(readSample('fernhill-hall.dxf'));
  return { ...r, geometry: { type: 'FeatureCollection', features } };
}

describe('geometry JSON from the packed arrays', () => {
  it('is exactly JSON.stringify of the GeoJSON the packed form rebuilds (property test)', () => {
    const base = resultOf([]);
    fc.assert(
      fc.property(fc.array(feature, { maxLength: 12 }), (features) => {
        const packed = packResult({ ...base, geometry: { type: 'FeatureCollection', features } });
        const text = packedGeometryJson(packed);
        expect(text).toBe(JSON.stringify(unpackResult(packed).geometry));
        // and the values are those of the features packed
        expect(JSON.parse(text)).toEqual(JSON.parse(JSON.stringify({ type: 'FeatureCollection', features })));
      }),
      { numRuns: 300 },
    );
  });

  it('is exactly what the upload stored before (JSON.stringify of the worker result) for every sample plan', async () => {
    const files = readdirSync(SAMPLES_DIR).filter((f) => f.toLowerCase().endsWith('.dxf'));
    expect(files.length).toBeGreaterThanOrEqual(4);
    for (const file of files) {
      const text = readSample(file);
      for (const opts of [{}, { units: 'cm' as const }]) {
        const before = JSON.stringify((await parseInWorker(text, opts)).geometry);
        const packed = await parseInWorkerPacked(text, opts);
        expect(packedGeometryJson(packed), file).toBe(before);
        expect(packedGeometryJson(packed), file).toBe(JSON.stringify(importDxf(text, opts).geometry));
      }
    }
  }, 120_000);
});
