/**
 * The placement worker's jobs, apart from the worker global so tests can drive them: a placement
 * search or an auto-layout runs as the shared generators, in slices of about SLICE_MS, posting the
 * map as it refines (at most every MAP_EVERY_MS) and stopping between slices when cancelled.
 */
import { autoLayoutSteps, layoutScore, proposalContent } from '@shared/analysis';
import { createAnalyzer } from '@shared/analysis';
import { prepareFloor } from '@shared/analysis';
import { placementSteps } from '@shared/analysis';
import { placementQueryOf } from '@shared/analysis';
import type { ArmReachFactory, PreparedFloor } from '@shared/analysis';
import { readableMessage } from '@shared/schemas/errors';
import type { FromPlacementWorker, PlacementJobInput, ToPlacementWorker } from './placementProtocol';

/** What a failed search tells the planner: an input problem's own sentence; never an internal error's text. */
function failureText(err: unknown): string {
  const text = readableMessage(err, null);
  if (text === null) console.error(err);
  return text ?? 'The search could not run on this layout; check the arms and work points chosen, then try again.';
}

const SLICE_MS = 12;
const MAP_EVERY_MS = 120;

type ReachAdapter = (params: unknown, restrict: Parameters<ArmReachFactory>[1]) => ReturnType<ArmReachFactory>;

export interface PlacementSession {
  /** Handles one message; jobs continue through `schedule` until done or cancelled. */
  receive(msg: ToPlacementWorker): void;
}

export function createPlacementSession(reachOf: ReachAdapter, post: (m: FromPlacementWorker) => void, schedule: (fn: () => void) => void, now: () => number = () => performance.now()): PlacementSession {
  const cancelled = new Set<number>();
  let floorKey: unknown = null;
  let prepared: PreparedFloor | null = null;

  function context(input: PlacementJobInput) {
    if (input.floor !== floorKey) {
      floorKey = input.floor;
      prepared = input.floor ? prepareFloor(input.floor.geometry, input.floor.layers) : null;
    }
    const params = new Map(input.models.map((m) => [m.id, m.params]));
    const reachFor: ArmReachFactory = (id, restrict) => {
      if (!params.has(id)) throw new Error(`arm model ${id} is not in the catalogue`);
      return reachOf(params.get(id), restrict);
    };
    return { floor: prepared, reachFor };
  }

  function drive<Y, R>(id: number, it: Generator<Y, R, void>, onYield: (y: Y, t: number) => void, onDone: (r: R) => void) {
    const slice = () => {
      if (cancelled.has(id)) {
        cancelled.delete(id);
        post({ type: 'cancelled', id });
        return;
      }
      try {
        const t0 = now();
        for (;;) {
          const s = it.next();
          if (s.done) return onDone(s.value);
          onYield(s.value, now());
          if (now() - t0 > SLICE_MS) break;
        }
      } catch (err) {
        post({ type: 'error', id, message: failureText(err) });
        return;
      }
      schedule(slice);
    };
    slice();
  }

  return {
    receive(msg) {
      if (msg.type === 'cancel') {
        cancelled.add(msg.id);
        return;
      }
      let ctx;
      try {
        ctx = context(msg);
      } catch (err) {
        post({ type: 'error', id: msg.id, message: failureText(err) });
        return;
      }
      if (msg.type === 'search') {
        let it;
        try {
          it = placementSteps(placementQueryOf(msg.request, msg.content, ctx.floor, ctx.reachFor));
        } catch (err) {
          post({ type: 'error', id: msg.id, message: failureText(err) });
          return;
        }
        let lastMap = -Infinity;
        let lastStage = '';
        drive(msg.id, it, (y, t) => {
          if (y.stage !== lastStage || t - lastMap > MAP_EVERY_MS) {
            lastStage = y.stage;
            lastMap = t;
            post({ type: 'map', id: msg.id, progress: y.progress, map: y.map, names: y.names });
          } else post({ type: 'progress', id: msg.id, progress: y.progress });
        }, (result) => post({ type: 'searched', id: msg.id, result }));
        return;
      }
      const req = msg.request;
      const byId = new Map(msg.content.workPoints.map((p) => [p.id, p]));
      const missing = req.pointIds.filter((p) => !byId.has(p));
      if (missing.length) {
        post({ type: 'error', id: msg.id, message: `No work point ${missing[0]} on this cell layout` });
        return;
      }
      let it;
      try {
        it = autoLayoutSteps({
          models: req.models.map((m) => ({ armModelId: m.armModelId, count: m.count, reach: ctx.reachFor(m.armModelId, undefined) })),
          points: req.pointIds.map((p) => byId.get(p)!),
          minMarginMm: req.minMarginMm, mountHeightMm: req.mountHeightMm, floor: ctx.floor, boundaries: msg.content.boundaries,
          seed: req.seed, timeLimitMs: req.timeLimitS * 1000, takenIds: [], now,
        });
      } catch (err) {
        post({ type: 'error', id: msg.id, message: failureText(err) });
        return;
      }
      drive(msg.id, it, (y) => post({ type: 'progress', id: msg.id, progress: y.progress }), (result) => {
        const proposal = proposalContent(msg.content, result);
        // Both scores from the same analysis code, on the same floor and models.
        const score = (c: typeof proposal) => layoutScore(createAnalyzer(ctx.reachFor).analyze({ arms: c.arms, workPoints: c.workPoints, boundaries: c.boundaries, workHeights: c.workHeights, floor: ctx.floor }));
        post({ type: 'proposed', id: msg.id, result, proposal, scores: { current: score(msg.content), proposal: score(proposal) } });
      });
    },
  };
}
