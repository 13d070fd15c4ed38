import { useMemo, useState } from 'react';
import type { AxisInfo, ForwardResult } from '@shared/kinematics';
import { axesOf, forwardOf, type ArmModelParams } from './modelCore';
import type { PoseView } from './profileDrawing';
import { sideViewPoints } from './sideView';

/** The value an axis starts at: 0 when inside its limits, else the nearer limit. */
export function startValue(axis: AxisInfo): number {
  return Math.min(axis.max, Math.max(axis.min, 0));
}

export interface PoseState {
  axes: AxisInfo[];
  joints: number[];
  setJoint(index: number, value: number): void;
  reset(): void;
  result: ForwardResult | null;
  /** What the side view draws: this pose, or the last good one greyed when this one fails. */
  view: PoseView | null;
}

/** One pose of a model in controller units (deg / mm) and its forward kinematics from the shared core. */
export function usePose(params: ArmModelParams | null): PoseState {
  const axes = useMemo(() => (params ? axesOf(params) : []), [params]);
  const [joints, setJoints] = useState<number[]>(() => axes.map(startValue));
  // A different axis count is a different arm: start again from the start pose (adjusted while
  // rendering, so no frame shows the old joints against the new axes).
  if (joints.length !== axes.length) setJoints(axes.map(startValue));

  const result = useMemo(() => {
    if (!params || joints.length !== axes.length) return null;
    try {
      return forwardOf(params, joints);
    } catch {
      return null;
    }
  }, [params, joints, axes.length]);

  const points = useMemo(() => (result?.ok ? sideViewPoints(result.frames) : null), [result]);
  // The last pose that could be drawn, shown greyed while the current one fails.
  const [lastGood, setLastGood] = useState<Array<[number, number]> | null>(null);
  if (points && points !== lastGood) setLastGood(points);
  const view = useMemo((): PoseView | null => {
    if (points) return { points, ok: true };
    if (result && lastGood) return { points: lastGood, ok: false };
    return null;
  }, [points, result, lastGood]);

  return {
    axes,
    joints,
    setJoint: (index, value) => setJoints((old) => old.map((v, i) => (i === index ? value : v))),
    reset: () => setJoints(axes.map(startValue)),
    result,
    view,
  };
}
