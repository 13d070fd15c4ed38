import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { LayoutContent, WorkPoint } from '@shared/schemas/layout';
import { parseWorkPointsCsv } from '../../../frontend/src/components/layout/workPointsCsv';

const text = readFileSync(new URL('../../../samples/work-points/fernhill-line3.csv', import.meta.url), 'utf8');

describe('samples/work-points/fernhill-line3.csv', () => {
  const parsed = parseWorkPointsCsv(text, { armIds: ['R1', 'R2', 'R3', 'R4'] });
  const points = parsed.points.map((p) => p.point);

  it('imports without errors or notes, 20–40 points, each a valid WorkPoint', () => {
    expect(parsed.errors).toEqual([]);
    expect(parsed.notes).toEqual([]);
    expect(points.length).toBeGreaterThanOrEqual(20);
    expect(points.length).toBeLessThanOrEqual(40);
    for (const p of points) expect(WorkPoint.parse(p)).toEqual(p);
    const content = LayoutContent.safeParse({
      arms: ['R1', 'R2', 'R3', 'R4'].map((id, i) => ({ id, armModelId: 1, x: i * 1000, y: 0, yaw: 0 })),
      workPoints: points,
    });
    expect(content.success).toBe(true);
  });

  it('places the points where the demo cell does its work', () => {
    const byTag = (f: (t: string) => boolean) => points.filter((p) => f(p.tag));
    const infeed = byTag((t) => t === 'infeed');
    const cases = byTag((t) => t === 'case');
    const pallet = byTag((t) => t.startsWith('pallet L'));
    expect(infeed.length + cases.length + pallet.length).toBe(points.length);
    for (const p of infeed) {
      expect(p.x).toBeGreaterThanOrEqual(10000);
      expect(p.x).toBeLessThanOrEqual(16000);
      expect(p.y).toBeGreaterThanOrEqual(6000);
      expect(p.y).toBeLessThanOrEqual(6800);
      expect(p.z).toBe(900);
    }
    for (const p of cases) {
      expect([p.x >= 17200 && p.x <= 19000, p.y >= 2000 && p.y <= 4500, p.z >= 800 && p.z <= 1100]).toEqual([true, true, true]);
    }
    for (const p of pallet) {
      expect([p.x >= 19500 && p.x <= 21000, p.y >= 9800 && p.y <= 11200, p.z >= 150 && p.z <= 1600]).toEqual([true, true, true]);
    }
    expect(new Set(pallet.map((p) => p.tag))).toEqual(new Set(['pallet L1', 'pallet L2', 'pallet L3', 'pallet L4']));
  });

  it('reports every assigned arm when the layout lacks them', () => {
    const bare = parseWorkPointsCsv(text, { armIds: [] });
    expect(bare.points).toEqual([]);
    expect(bare.errors.length).toBe(points.length);
    expect(bare.errors[0]).toEqual({ row: 2, message: 'assigned arm R1 is not on this cell layout' });
  });
});
