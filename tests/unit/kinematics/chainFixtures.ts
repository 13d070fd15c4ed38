// Chains shared by the chain tests and the benchmark.
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { chainParamsSchema, type ChainParams } from '@shared/kinematics/chain';

export const demoSixAxisPath = fileURLToPath(new URL('../../../samples/arm-models/demo-six-axis-2000.json', import.meta.url));

/** The demo catalogue model, parsed with the app's schema. */
export function demoSixAxis(): ChainParams {
  return chainParamsSchema.parse(JSON.parse(readFileSync(demoSixAxisPath, 'utf8')).params);
}

/** The six-axis DH worked example (Corke, Robotics, Vision and Control, 2nd ed.), mm, with plausible limits. */
export const sixAxisExample: ChainParams = chainParamsSchema.parse({
  family: 'chain',
  convention: 'standard',
  joints: [
    { type: 'revolute', theta: 0, d: 0, a: 0, alpha: 90, min: -160, max: 160 },
    { type: 'revolute', theta: 0, d: 0, a: 431.8, alpha: 0, min: -225, max: 45 },
    { type: 'revolute', theta: 0, d: 150.05, a: 20.3, alpha: -90, min: -160, max: 160 },
    { type: 'revolute', theta: 0, d: 431.8, a: 0, alpha: 90, min: -110, max: 170 },
    { type: 'revolute', theta: 0, d: 0, a: 0, alpha: -90, min: -100, max: 100 },
    { type: 'revolute', theta: 0, d: 0, a: 0, alpha: 0, min: -266, max: 266 },
  ],
  tool: { x: 0, y: 0, z: 0 },
});

/** A gantry-like chain with prismatic joints: vertical J1, a vertical stroke, a radial stroke, a wrist. */
export const prismaticChain: ChainParams = chainParamsSchema.parse({
  family: 'chain',
  convention: 'standard',
  joints: [
    { type: 'revolute', theta: 0, d: 400, a: 0, alpha: 0, min: -170, max: 170, zeroOffset: 15, direction: -1 },
    { type: 'prismatic', theta: 90, d: 200, a: 0, alpha: 90, min: 0, max: 900 },
    { type: 'prismatic', theta: 0, d: 300, a: 0, alpha: -90, min: -100, max: 700, direction: -1 },
    { type: 'revolute', theta: 30, d: 80, a: 120, alpha: 0, min: -120, max: 120 },
  ],
  tool: { x: 40, y: -25, z: 90 },
});

/** A modified-DH (Craig) chain with offsets in every row. */
export const modifiedChain: ChainParams = chainParamsSchema.parse({
  family: 'chain',
  convention: 'modified',
  joints: [
    { type: 'revolute', theta: 0, d: 350, a: 0, alpha: 0, min: -180, max: 180 },
    { type: 'revolute', theta: -90, d: 0, a: 75, alpha: -90, min: -100, max: 130, zeroOffset: 5 },
    { type: 'revolute', theta: 0, d: 0, a: 640, alpha: 0, min: -150, max: 70, direction: -1 },
    { type: 'revolute', theta: 0, d: 700, a: 110, alpha: -90, min: -190, max: 190 },
    { type: 'revolute', theta: 0, d: 0, a: 0, alpha: 90, min: -120, max: 120 },
    { type: 'revolute', theta: 0, d: 95, a: 0, alpha: -90, min: -350, max: 350 },
  ],
  tool: { x: 0, y: 60, z: 180 },
});

/** A deterministic pseudo-random generator (mulberry32) for reproducible poses. */
export function seeded(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** A random in-limit pose (controller units). */
export function randomPose(p: ChainParams, rand: () => number): number[] {
  return p.joints.map((j) => j.min + rand() * (j.max - j.min));
}
