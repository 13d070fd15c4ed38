// Fence bill of materials: run arithmetic (a run of centre-line length L between two post centres
// takes panels wᵢ and n − 1 posts of width p: L = Σ wᵢ + n·p) worked by hand below [derived].
// Two floor anchors per post and double leaves above 1500 mm clear width are common practice [practice].
import { describe, expect, it } from 'vitest';
import { bomCsv, fenceLinesOf, fenceParts, MIN_CUT_PANEL_MM, splitRun } from '@shared/analysis/fenceBom';
import { DEFAULT_FENCE_SYSTEM } from '@shared/schemas/fenceProposal';
import type { Boundary } from '@shared/schemas/layout';

const W = [200, 300, 500, 700, 1000, 1200, 1500];
const built = (panels: Array<{ widthMm: number }>, p: number) => panels.reduce((s, x) => s + x.widthMm + p, 0);

describe('splitRun', () => {
  it('fills an exact run with stocked panels only', () => {
    // 2 × (1500 + 60) = 3120 mm: two full panels, one post between them.
    expect(splitRun(3120, W, 60).panels).toEqual([{ widthMm: 1500, cutFromMm: null }, { widthMm: 1500, cutFromMm: null }]);
    // 1500 + 60 + 700 + 60 + 200 + 60 = 2580 mm: stocked widths, largest first.
    expect(splitRun(2580, W, 60).panels.map((x) => x.widthMm)).toEqual([1500, 700, 200]);
  });

  it('closes the last gap with one cut panel and never cuts below the smallest sensible width', () => {
    // 3000 mm: 1500 + 60, then 3000 − 1560 − 60 = 1380 mm cut from a 1500 mm panel.
    const a = splitRun(3000, W, 60);
    expect(a.panels).toEqual([{ widthMm: 1500, cutFromMm: null }, { widthMm: 1380, cutFromMm: 1500 }]);
    // 1600 mm: 1500 leaves −20 mm; a 1200 before it leaves 1600 − 1260 − 60 = 280 mm, cut from a 300.
    const b = splitRun(1600, W, 60);
    expect(b.panels).toEqual([{ widthMm: 1200, cutFromMm: null }, { widthMm: 280, cutFromMm: 300 }]);
    for (const L of [950, 1234, 3333, 7777.7, 12345]) {
      const r = splitRun(L, W, 60);
      expect(Math.abs(built(r.panels, 60) - L)).toBeLessThanOrEqual(1);
      expect(r.panels.filter((x) => x.cutFromMm != null).length).toBeLessThanOrEqual(1);
      expect(r.panels.every((x) => x.widthMm >= MIN_CUT_PANEL_MM)).toBe(true);
    }
  });
});

describe('BOM of fences drawn by hand', () => {
  it('counts panels, corner, line and wall-fixing posts, doors with interlocks and anchors', () => {
    // An L: 3120 mm east (two full panels), then 3120 mm north with a 1000 mm door in the middle.
    const boundaries: Boundary[] = [
      { id: 'F1', kind: 'fence', label: '', height: 2000, points: [[0, 0], [3120, 0], [3120, 3120]] },
      { id: 'O1', kind: 'opening', label: '', fenceId: 'F1', points: [[3120, 1060], [3120, 2060]] },
    ];
    const walls: Array<[[number, number], [number, number]]> = [[[0, -1000], [0, 1000]]];
    const parts = fenceParts(fenceLinesOf(boundaries), DEFAULT_FENCE_SYSTEM, walls);
    expect(parts.lengthMm).toBeCloseTo(6240, 6);
    expect(parts.doors).toMatchObject([{ id: 'O1', widthMm: 1000 }]);
    // North leg: 0…1030 and 2090…3120 centre-line (door posts outside the 1000 mm clear width): two runs of 1030 mm.
    expect(parts.runs.map((r) => Math.round(r.lengthMm))).toEqual([3120, 1030, 1030]);
    const q = (item: string, size?: string) => parts.bom.find((b) => b.item === item && (!size || b.size.startsWith(size)))?.quantity;
    expect(q('panel', '1500')).toBe(2);
    // 1030 = 970 + 60: one 1000 mm panel cut to 970 mm on each side of the door.
    expect(q('panel, cut', '1000')).toBe(2);
    expect(q('post, corner')).toBe(1);
    expect(q('post, wall-fixing')).toBe(1);
    // The open north end, one post between the two east panels and the two door posts.
    expect(q('post, line')).toBe(4);
    expect(q('door, single-leaf')).toBe(1);
    expect(q('interlock')).toBe(1);
    expect(q('floor anchor')).toBe(12);
  });

  it('writes the BOM as CSV with quoting where a field needs it', () => {
    const csv = bomCsv([{ item: 'panel', size: '1500 × 2000 mm', quantity: 3 }, { item: 'post, line', size: '60 mm', quantity: 4 }]);
    expect(csv).toBe('item,size,quantity\r\npanel,1500 × 2000 mm,3\r\n"post, line",60 mm,4\r\n');
  });
  it('opens the CSV with the notes (what, state, date, cautions) as "# " lines, one cell each', () => {
    const csv = bomCsv([{ item: 'panel', size: '1500 × 2000 mm', quantity: 3 }], ['Ringfence fence parts · cell layout A', 'say "no"']);
    expect(csv).toBe('"# Ringfence fence parts · cell layout A"\r\n"# say ""no"""\r\nitem,size,quantity\r\npanel,1500 × 2000 mm,3\r\n');
  });
});
