// Results cross from the analysis worker to the page as deltas: decoded in order, every view must
// equal the whole result the worker computed (each copied with structuredClone, the browser's own
// algorithm for postMessage), through drags, added and removed points and arms, and new models —
// while a drag's delta carries a small part of the whole. The analyzer itself is the reference.
import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { armReachFor } from '@shared/analysis';
import type { LayoutContent, WorkPoint } from '@shared/schemas/layout';
import { createDeltaDecoder, createDeltaEncoder } from '../../../frontend/src/workers/analysisDelta';
import { createAnalysisSession } from '../../../frontend/src/workers/analysisSession';

const samples = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../samples/arm-models');
const MODELS = ['demo-scara-600', 'demo-articulated-1400', 'demo-palletizer-3100'].map((f, i) => ({
  id: i + 1,
  params: JSON.parse(readFileSync(path.join(samples, `${f}.json`), 'utf8')).params,
}));

function layout(): LayoutContent {
  const arms = Array.from({ length: 8 }, (_, i) => ({ id: `R${i + 1}`, armModelId: 1 + (i % 3), label: '', x: (i % 4) * 2600, y: Math.floor(i / 4) * 2600, yaw: i * 40, mountHeight: 0 }));
  const workPoints: WorkPoint[] = [];
  for (let i = 0; i < 600; i++) workPoints.push({ id: `P${i + 1}`, x: ((i * 7919) % 9000) - 500, y: ((i * 104729) % 4500) - 500, z: [800, 1000][i % 2], approach: 'top', tag: '' });
  return { arms, workPoints, boundaries: [{ id: 'F1', kind: 'fence', label: '', points: [[-2500, -2500], [10500, -2500], [10500, 5000]], height: 1400 }], workHeights: [800, 1000] };
}

describe('analysis results as deltas', () => {
  it('decode to the whole result after every step, and a drag sends a small part of it', () => {
    const s = createAnalysisSession(armReachFor);
    const enc = createDeltaEncoder();
    // A second encoder told which coverage rows the analyzer changed: it must send the same deltas
    // as the one that compares every row (so the list the analyzer keeps misses no row).
    const hinted = createDeltaEncoder();
    const dec = createDeltaDecoder();
    let c = layout();
    let hints = 0;
    // Deltas whose findings changed while their order stayed: the decoder patches its list then.
    let patchedInPlace = 0;
    const step = () => {
      const { seq: _seq, dragging: _dragging, coverageChanged, ...view } = s.run()!;
      const whole = structuredClone(view);
      const delta = structuredClone(enc.encode(view));
      if (coverageChanged) {
        hints++;
        expect(coverageChanged.length).toBeLessThan(c.workPoints.length);
      }
      expect(structuredClone(hinted.encode(view, coverageChanged))).toEqual(delta);
      if (delta.findingOrder === null && delta.findings.length > 0) patchedInPlace++;
      const got = dec.decode(delta);
      expect(got.analysis).toEqual(whole.analysis);
      expect(got.maxSpaces).toEqual(whole.maxSpaces);
      expect(got.placed).toEqual(whole.placed);
      return { delta, whole };
    };
    s.receive({ type: 'models', models: MODELS });
    s.receive({ type: 'content', seq: 1, content: c });
    const first = step();
    expect(first.delta.reset).toBe(true);

    let seq = 2;
    let before: string | null = null;
    for (const [armId, dx] of [['R2', 300], ['R2', 600], ['R5', -400], ['R2', 900]] as const) {
      const a = c.arms.find((x) => x.id === armId)!;
      s.receive({ type: 'drag', seq: seq++, pose: { armId, x: a.x + dx, y: a.y + dx / 2, yaw: a.yaw + 10 } });
      const { delta, whole } = step();
      expect(delta.reset).toBe(false);
      // One arm of eight moved: less than half of the whole result crosses (on large layouts far less).
      expect(JSON.stringify(delta).length).toBeLessThan(JSON.stringify(whole).length / 2);
      // The dragged arm's regions cross, and those of the arm dragged before it (back at its place).
      expect(Object.keys(delta.regions).sort()).toEqual([...new Set([armId, before ?? armId])].sort());
      before = armId;
    }
    // Commit the drag, remove points and an arm, add a point: removals cross too.
    c = { ...c, arms: c.arms.filter((a) => a.id !== 'R7'), workPoints: [...c.workPoints.slice(50), { id: 'PX', x: 100, y: 100, z: 800, approach: 'any', tag: 'new' }] };
    s.receive({ type: 'content', seq: seq++, content: c });
    const removed = step();
    expect(removed.delta.regionsRemoved).toEqual(['R7']);
    expect(removed.delta.coverageRemoved).toHaveLength(50);
    // New models rebuild the analyzer: everything is new by identity, still decoded right.
    s.receive({ type: 'models', models: MODELS.map((m) => ({ ...m })) });
    step();
    s.receive({ type: 'drag', seq, pose: { armId: 'R1', x: 200, y: 200, yaw: 0 } });
    step();
    // The drags and the drag after new models came with a list; the first result, new points and
    // new models without.
    expect(hints).toBe(5);
    expect(patchedInPlace).toBeGreaterThan(0);
  }, 60_000);
});
