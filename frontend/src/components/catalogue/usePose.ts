import { useEffect, useMemo, useRef, useState } from 'react';
import type { AxisInfo, ForwardResult } from '@shared/kinematics/types';
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
  const lastGood = useRef<Array<[number, number]> | null>(null);

  // A different axis count is a different arm: start again from the start pose.
  useEffect(() => {
    setJoints((old) => (old.length === axes.length ? old : axes.map(startValue)));
  }, [axes]);

  const result = useMemo(() => {
    if (!params || joints.length !== axes.length) return null;
    try {
      return forwardOf(params, joints);
    } catch {
      return null;
    }
  }, [params, joints, axes.length]);

  const view = useMemo((): PoseView | null => {
    if (result?.ok) {
      const points = sideViewPoints(result.frames);
      lastGood.current = points;
      return { points, ok: true };
    }
    if (result && lastGood.current) return { points: lastGood.current, ok: false };
    return null;
  }, [result]);

  return {
    axes,
    joints,
    setJoint: (index, value) => setJoints((old) => old.map((v, i) => (i === index ? value : v))),
    reset: () => setJoints(axes.map(startValue)),
    result,
    view,
  };
}
