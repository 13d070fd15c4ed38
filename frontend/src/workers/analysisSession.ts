/**
 * The state the analysis worker keeps between messages: one analyzer (its per-arm, per-pair and
 * per-column caches survive every edit), the arm models' reach regions built once per (model,
 * restricting limits), the prepared floor, the latest content and the pose being dragged. Pure
 * apart from its own caches, so it runs the same in a test as in the worker.
 */
import { createAnalyzer, MISSING_MODEL_TEXT, placedMaxSpace, type Analyzer } from '@shared/analysis';
import { prepareFloor } from '@shared/analysis';
import { checkSectionLine, sectionOf, type SectionArm, type SectionLine, type SectionResult } from '@shared/analysis';
import type { ArmReach, PreparedFloor } from '@shared/analysis';
import { armPose } from '@shared/geometry';
import type { AreaGeometry } from '@shared/geometry';
import type { Polygon2 } from '@shared/geometry';
import { ReadableError } from '@shared/schemas/errors';
import type { ArmPlacement, LayoutContent } from '@shared/schemas/layout';
import type { AnalysisView, DragPose, ToWorker, WorkerArmModel } from './analysisProtocol';

/** Builds an arm model's reach under restricting J1 limits (controller degrees); throws on bad parameters. */
export type ReachBuilder = (params: unknown, restrict: ArmPlacement['restrict']) => ArmReach;

const restrictKey = (r: ArmPlacement['restrict']) => (r ? `${r.j1Min},${r.j1Max}` : '-');

/** Arm-frame polygons placed on the plan: rotated by yaw (deg CCW) about the base, moved to (x, y) mm. */
export function placePolygons(polys: ReadonlyArray<Polygon2>, x: number, y: number, yawDeg: number): Polygon2[] {
  return armPose({ x, y, yaw: yawDeg }).placePolygons(polys);
}

/** The content with the dragged arm at its drag pose (the content itself when nothing is dragged). */
export function contentWithPose(content: LayoutContent, pose: DragPose | null): LayoutContent {
  if (!pose) return content;
  const i = content.arms.findIndex((a) => a.id === pose.armId);
  if (i < 0) return content;
  const arms = content.arms.slice();
  arms[i] = { ...arms[i], x: pose.x, y: pose.y, yaw: pose.yaw };
  return { ...content, arms };
}

export interface AnalysisSession {
  /** Applies one message; returns true when the analysis should run again. */
  receive(msg: ToWorker): boolean;
  /**
   * Analyses the latest content (with the drag pose applied); null before any content arrived.
   * `coverageChanged` lists the work points whose coverage row differs from the run before (null:
   * any may), so the result's delta need not compare every row.
   */
  run(): (AnalysisView & { seq: number; dragging: boolean; coverageChanged: string[] | null }) | null;
  /** Sequence number of the latest input (content or drag pose). */
  currentSeq(): number;
  /** How many reach regions were built so far (each model × restricting limits once). */
  reachBuilds(): number;
  analyzer(): Analyzer;
}

/** Creates the worker's session around a reach builder. */
export function createAnalysisSession(build: ReachBuilder): AnalysisSession {
  let models = new Map<number, unknown>();
  const reaches = new Map<string, ArmReach>();
  const maxSpaces = new Map<string, AreaGeometry | null>();
  let builds = 0;
  let floor: PreparedFloor | null = null;
  let content: LayoutContent | null = null;
  let pose: DragPose | null = null;
  let sectionLine: SectionLine | null = null;
  let seq = 0;

  function reachOf(modelId: number, restrict: ArmPlacement['restrict']): ArmReach {
    const key = `${modelId}|${restrictKey(restrict)}`;
    let r = reaches.get(key);
    if (!r) {
      if (!models.has(modelId)) throw new ReadableError(MISSING_MODEL_TEXT);
      r = build(models.get(modelId), restrict);
      builds++;
      reaches.set(key, r);
    }
    return r;
  }

  let analyzer = createAnalyzer(reachOf);

  function maxSpaceOf(a: ArmPlacement): AreaGeometry | null {
    const key = `${a.id}|${a.armModelId}|${a.x}|${a.y}|${a.yaw}`;
    if (maxSpaces.has(key)) return maxSpaces.get(key)!;
    const g = placedMaxSpace(reachOf, a);
    maxSpaces.set(key, g);
    return g;
  }

  /** The side view of the content (drag pose applied) along the current line; arms whose reach cannot be built are left out (the analysis reports them). */
  function sectionOfContent(c: LayoutContent): SectionResult | null {
    if (!sectionLine) return null;
    const arms: SectionArm[] = [];
    for (const a of c.arms) {
      try {
        arms.push({ id: a.id, label: a.label, pose: a, envelope: reachOf(a.armModelId, a.restrict).envelope });
      } catch {
        // reported by the analysis as unknown-model
      }
    }
    return sectionOf({ line: sectionLine, floor, boundaries: c.boundaries, arms });
  }

  return {
    receive(msg) {
      switch (msg.type) {
        case 'models':
          models = new Map(msg.models.map((m: WorkerArmModel) => [m.id, m.params]));
          reaches.clear();
          maxSpaces.clear();
          analyzer = createAnalyzer(reachOf);
          return content !== null;
        case 'floor':
          floor = msg.floor ? prepareFloor(msg.floor.geometry, msg.floor.layers) : null;
          return content !== null;
        case 'content':
          content = msg.content;
          pose = null;
          seq = msg.seq;
          return true;
        case 'drag':
          pose = msg.pose;
          seq = msg.seq;
          return content !== null;
        case 'section':
          if (msg.line) checkSectionLine(msg.line);
          sectionLine = msg.line;
          return content !== null;
      }
    },
    run() {
      if (!content) return null;
      const c = contentWithPose(content, pose);
      const analysis = analyzer.analyze({ arms: c.arms, workPoints: c.workPoints, boundaries: c.boundaries, workHeights: c.workHeights, floor });
      const spaces: Record<string, AreaGeometry | null> = {};
      const placed: Record<string, [number, number, number]> = {};
      const live = new Set<string>();
      for (const a of c.arms) {
        spaces[a.id] = maxSpaceOf(a);
        placed[a.id] = [a.x, a.y, a.yaw];
        live.add(`${a.id}|${a.armModelId}|${a.x}|${a.y}|${a.yaw}`);
      }
      for (const k of maxSpaces.keys()) if (!live.has(k)) maxSpaces.delete(k);
      const changes = analyzer.lastCoverageChanges();
      const coverageChanged = changes ? Array.from(changes, (i) => c.workPoints[i].id) : null;
      return { analysis, maxSpaces: spaces, placed, section: sectionOfContent(c), seq, dragging: pose !== null, coverageChanged };
    },
    currentSeq: () => seq,
    reachBuilds: () => builds,
    analyzer: () => analyzer,
  };
}
