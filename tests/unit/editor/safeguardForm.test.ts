// The inspector's safeguard and mesh fields: text → stored values through the layout schema, and
// errors that start with the field's label. (Form plumbing; the distances are checked elsewhere.)
import { describe, expect, it } from 'vitest';
import type { LayoutContent } from '@shared/schemas/layout';
import { setBoundarySafeguarding } from '../../../frontend/src/editor/layoutEdits';
import { parseMeshForm, parseSafeguardForm, safeguardFieldsFor, safeguardFormValues, type SafeguardFormValues } from '../../../frontend/src/editor/safeguardForm';

const blank: SafeguardFormValues = { device: '', responseTimeS: '', stopCategory: '', resolutionMm: '', beams: '', approach: 'normal', heightMm: '' };

describe('safeguard form', () => {
  it('stores an interlocked door and reads it back', () => {
    const r = parseSafeguardForm({ ...blank, device: 'interlock', responseTimeS: '0,05', stopCategory: '1', resolutionMm: '14' });
    expect(r).toEqual({ ok: true, safeguard: { device: 'interlock', responseTimeS: 0.05, stopCategory: 1, approach: 'normal' } });
    const boundary = { id: 'O1', kind: 'opening' as const, label: '', points: [[0, 0], [1000, 0]] as Array<[number, number]>, fenceId: 'F1', safeguard: r.ok ? r.safeguard! : undefined };
    expect(safeguardFormValues(boundary)).toMatchObject({ device: 'interlock', responseTimeS: '0.05', stopCategory: '1' });
  });

  it('asks for what each device needs, naming the field', () => {
    expect(safeguardFieldsFor('light-curtain', 'parallel')).toEqual(['device', 'responseTimeS', 'stopCategory', 'resolutionMm', 'approach', 'heightMm']);
    expect(safeguardFieldsFor('multi-beam', 'normal')).toContain('beams');
    const r = parseSafeguardForm({ ...blank, device: 'light-curtain', responseTimeS: 'fast' });
    expect(r.ok).toBe(false);
    if (r.ok) return;
    expect(r.errors.responseTimeS).toBe('Response time (s): enter a number');
    expect(r.errors.stopCategory).toMatch(/^Stop category: /);
    const c = parseSafeguardForm({ ...blank, device: 'light-curtain', responseTimeS: '0.02', stopCategory: '0' });
    expect(c.ok === false && c.errors.resolutionMm).toBe('Give the light curtain its resolution (mm)');
    expect(parseSafeguardForm(blank)).toEqual({ ok: true, safeguard: null });
  });

  it('takes a mesh as both size and shape, or neither', () => {
    expect(parseMeshForm('', '')).toEqual({ ok: true, meshMm: null, meshShape: null });
    expect(parseMeshForm('25', 'square')).toEqual({ ok: true, meshMm: 25, meshShape: 'square' });
    const big = parseMeshForm('200', 'slot');
    expect(big.ok === false && big.errors.meshMm).toMatch(/^Mesh size \(mm\): at most 120 mm/);
    const noShape = parseMeshForm('20', '');
    expect(noShape.ok === false && noShape.errors.meshShape).toMatch(/^Mesh shape: /);
  });

  it('sets and removes a safeguard and a mesh without touching the input', () => {
    const content: LayoutContent = {
      arms: [], workPoints: [], workHeights: [],
      boundaries: [
        { id: 'F1', kind: 'fence', label: '', points: [[0, 0], [4000, 0]], height: 2000 },
        { id: 'O1', kind: 'opening', label: '', points: [[1000, 0], [2000, 0]], fenceId: 'F1' },
      ],
    };
    const frozen = JSON.stringify(content);
    const guarded = setBoundarySafeguarding(content, 'O1', { safeguard: { device: 'interlock-locking', responseTimeS: 0.05, stopCategory: 0, approach: 'normal' } });
    expect(guarded.boundaries[1].safeguard?.device).toBe('interlock-locking');
    expect('safeguard' in setBoundarySafeguarding(guarded, 'O1', { safeguard: null }).boundaries[1]).toBe(false);
    const meshed = setBoundarySafeguarding(content, 'F1', { mesh: { meshMm: 30, meshShape: 'round' } });
    expect(meshed.boundaries[0]).toMatchObject({ meshMm: 30, meshShape: 'round' });
    expect(() => setBoundarySafeguarding(content, 'F1', { safeguard: null })).toThrow(/not an access opening/);
    expect(JSON.stringify(content)).toBe(frozen);
  });
});
