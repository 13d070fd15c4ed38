import { zoomIdentity } from 'd3';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitTransform, planToScreen, screenToPlan } from '../../../frontend/src/plan/viewTransform';

// Independent implementation: d3-zoom's own ZoomTransform (general-purpose library, d3 7.9).
// The canvas draws plan (x, y) as the zoom transform applied to (x, −y), the mirror in the x axis.
const d3Screen = (t: { k: number; x: number; y: number }, x: number, y: number) =>
  zoomIdentity.translate(t.x, t.y).scale(t.k).apply([x, -y]);

describe('plan ↔ screen', () => {
  it('matches d3 ZoomTransform.apply on the y-mirrored point, and inverts it', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1e-4, max: 100, noNaN: true }),
        fc.double({ min: -1e5, max: 1e5, noNaN: true }),
        fc.double({ min: -1e5, max: 1e5, noNaN: true }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        (k, tx, ty, x, y) => {
          const t = { k, x: tx, y: ty };
          const [sx, sy] = planToScreen(t, { x, y });
          const [ex, ey] = d3Screen(t, x, y);
          expect(sx).toBeCloseTo(ex, 6);
          expect(sy).toBeCloseTo(ey, 6);
          const inv = zoomIdentity.translate(tx, ty).scale(k).invert([sx, sy]);
          const back = screenToPlan(t, sx, sy);
          expect(back.x).toBeCloseTo(inv[0], 4);
          expect(back.y).toBeCloseTo(-inv[1], 4);
          expect(back.x).toBeCloseTo(x, 3);
          expect(back.y).toBeCloseTo(y, 3);
        },
      ),
    );
  });

  it('puts north up: a point further north is higher on screen (smaller screen y)', () => {
    const t = { k: 0.05, x: 10, y: 500 };
    expect(planToScreen(t, { x: 0, y: 1000 })[1]).toBeLessThan(planToScreen(t, { x: 0, y: 0 })[1]);
  });

  it('rejects a view without a positive scale', () => {
    expect(() => screenToPlan({ k: 0, x: 0, y: 0 }, 1, 1)).toThrow(/transform/);
  });
});

describe('fitTransform', () => {
  // Worked by hand: a 24 m × 16 m hall in a 1000 × 600 px viewport with 20 px padding.
  // Width ratio 960/24000 = 0.04, height ratio 560/16000 = 0.035 → k = 0.035 px/mm;
  // centre (12000, 8000) goes to (500, 300): x = 500 − 420 = 80, y = 300 + 280 = 580.
  it('fits the demo hall by the tighter axis and centres it (worked by hand)', () => {
    const t = fitTransform({ minX: 0, minY: 0, maxX: 24000, maxY: 16000 }, 1000, 600, 20);
    expect(t.k).toBeCloseTo(0.035, 12);
    expect(t.x).toBeCloseTo(80, 9);
    expect(t.y).toBeCloseTo(580, 9);
  });

  it('keeps every corner of any bounds inside the padded viewport, one axis touching it', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: -1e6, max: 1e6, noNaN: true }),
        fc.double({ min: 1, max: 1e6, noNaN: true }),
        fc.double({ min: 1, max: 1e6, noNaN: true }),
        fc.integer({ min: 100, max: 4000 }),
        fc.integer({ min: 100, max: 4000 }),
        (x0, y0, w, h, vw, vh) => {
          const pad = 10;
          const b = { minX: x0, minY: y0, maxX: x0 + w, maxY: y0 + h };
          const t = fitTransform(b, vw, vh, pad);
          const [ax, ay] = d3Screen(t, b.minX, b.maxY); // north-west corner: top left
          const [bx, by] = d3Screen(t, b.maxX, b.minY); // south-east corner: bottom right
          const eps = 1e-6 * Math.max(vw, vh);
          expect(ax).toBeGreaterThanOrEqual(pad - eps);
          expect(ay).toBeGreaterThanOrEqual(pad - eps);
          expect(bx).toBeLessThanOrEqual(vw - pad + eps);
          expect(by).toBeLessThanOrEqual(vh - pad + eps);
          const touchesX = Math.abs(bx - ax - (vw - 2 * pad)) < 1e-6 * vw;
          const touchesY = Math.abs(by - ay - (vh - 2 * pad)) < 1e-6 * vh;
          expect(touchesX || touchesY).toBe(true);
        },
      ),
    );
  });

  it('fits a plan that is a single line or point without dividing by zero', () => {
    const line = fitTransform({ minX: 0, minY: 5, maxX: 1000, maxY: 5 }, 500, 500, 0);
    expect(line.k).toBeCloseTo(0.5, 12);
    const point = fitTransform({ minX: 7, minY: 7, maxX: 7, maxY: 7 }, 500, 500, 0);
    expect(Number.isFinite(point.k) && point.k > 0).toBe(true);
    expect(planToScreen(point, { x: 7, y: 7 })).toEqual([250, 250]);
  });

  it('rejects bounds the wrong way round and a viewport without size', () => {
    expect(() => fitTransform({ minX: 1, minY: 0, maxX: 0, maxY: 1 }, 10, 10)).toThrow(/bounds/);
    expect(() => fitTransform({ minX: 0, minY: 0, maxX: 1, maxY: 1 }, 0, 10)).toThrow(/width/);
  });

  it('the fitted view shows the whole bounds: the viewport corners lie outside them', () => {
    const b = { minX: -500, minY: 200, maxX: 9500, maxY: 4200 };
    const t = fitTransform(b, 800, 400, 16);
    const lowerLeft = screenToPlan(t, 0, 400);
    const upperRight = screenToPlan(t, 800, 0);
    expect(lowerLeft.x).toBeLessThanOrEqual(b.minX);
    expect(lowerLeft.y).toBeLessThanOrEqual(b.minY);
    expect(upperRight.x).toBeGreaterThanOrEqual(b.maxX);
    expect(upperRight.y).toBeGreaterThanOrEqual(b.maxY);
  });
});
