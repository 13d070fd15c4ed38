import { describe, expect, it } from 'vitest';
import type { ArmPlacement } from '@shared/schemas/layout';
import { armFormValues, parseArmForm, parseNumber } from '../../../frontend/src/editor/armForm';

const arm: ArmPlacement = { id: 'R1', armModelId: 2, label: '', x: 1200, y: -300.26, yaw: 90, mountHeight: 0 };

describe('arm inspector form', () => {
  it('reads numbers with a point or a comma and thousands spaces', () => {
    expect(parseNumber('1 250,5')).toBe(1250.5);
    expect(parseNumber('-0.5')).toBe(-0.5);
    expect(parseNumber('12a')).toBeNull();
    expect(parseNumber('')).toBeNull();
    expect(parseNumber('1e3')).toBeNull();
  });

  it('round-trips an arm through its text values', () => {
    const v = armFormValues({ ...arm, restrict: { j1Min: -120, j1Max: 45 } });
    expect(v).toMatchObject({ x: '1200', y: '-300.3', yaw: '90', j1Min: '-120', j1Max: '45' });
    const r = parseArmForm(arm, v);
    expect(r.ok && r.patch).toMatchObject({ x: 1200, y: -300.3, restrict: { j1Min: -120, j1Max: 45 } });
  });

  it('puts each error beside its field', () => {
    const r = parseArmForm(arm, { ...armFormValues(arm), x: '', yaw: 'north', j1Min: '10', j1Max: '-10' });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.x).toMatch(/Give the x position/);
    expect(r.errors.yaw).toMatch(/must be a number/);
    expect(r.errors.j1Max).toMatch(/above J1 min/);
    const half = parseArmForm(arm, { ...armFormValues(arm), j1Min: '-90' });
    expect(!half.ok && half.errors.j1Max).toMatch(/both J1 limits/);
  });

  it('empties both limits to drop the restriction', () => {
    const r = parseArmForm({ ...arm, restrict: { j1Min: -1, j1Max: 1 } }, { ...armFormValues(arm), j1Min: ' ', j1Max: '' });
    expect(r.ok && r.patch.restrict).toBeUndefined();
  });
});
