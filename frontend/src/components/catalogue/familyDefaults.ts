import type { z } from 'zod';
import type { ArmModelInput } from './modelCore';

/** The editor's form values (what the schema takes in). */
export type ArmModelFormValues = z.input<typeof ArmModelInput>;

/** Starting parameters of a new model per family: a plausible small arm to edit from (lengths mm, angles deg). */
export function defaultParams(family: string): ArmModelFormValues['params'] {
  switch (family) {
    case 'chain':
    default:
      return {
        family: 'chain',
        convention: 'standard',
        joints: [
          { type: 'revolute', a: 0, alpha: 90, d: 400, theta: 0, min: -170, max: 170, zeroOffset: 0, direction: 1 },
          { type: 'revolute', a: 600, alpha: 0, d: 0, theta: 0, min: -60, max: 150, zeroOffset: 0, direction: 1 },
          { type: 'revolute', a: 500, alpha: 0, d: 0, theta: 0, min: -150, max: 120, zeroOffset: 0, direction: 1 },
        ],
        tool: { x: 0, y: 0, z: 0 },
        payloadKg: 10,
        stopTimeS: 0.3,
      };
  }
}
