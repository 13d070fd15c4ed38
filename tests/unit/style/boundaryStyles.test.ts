import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { BOUNDARY_KINDS } from '@shared/schemas/layout';
import { BOUNDARY_STYLES } from '@shared/style/boundaryStyles';

// Consistency of the one style table; no outside source applies (these are the product's own choices).
describe('boundary styles', () => {
  it('has a style for every boundary kind the layout schema allows', () => {
    for (const kind of BOUNDARY_KINDS) expect(BOUNDARY_STYLES[kind], kind).toBeDefined();
  });

  it('gives kinds that share a DXF layer the same layer colour and line type', () => {
    const byLayer = new Map<string, { aci: number; lineType: string }>();
    for (const [kind, s] of Object.entries(BOUNDARY_STYLES)) {
      const seen = byLayer.get(s.dxf.layer);
      if (seen) expect({ aci: s.dxf.aci, lineType: s.dxf.lineType }, `${kind} on ${s.dxf.layer}`).toEqual(seen);
      else byLayer.set(s.dxf.layer, { aci: s.dxf.aci, lineType: s.dxf.lineType });
    }
  });

  it('keeps paper colours within sRGB 0–255 and widths positive', () => {
    for (const [kind, s] of Object.entries(BOUNDARY_STYLES)) {
      const colours = [s.paper.colour, 'legendColour' in s.paper ? s.paper.legendColour : undefined, 'label' in s.paper ? s.paper.label : undefined];
      for (const c of colours) if (Array.isArray(c)) for (const v of c) expect(Number.isInteger(v) && v >= 0 && v <= 255, `${kind}: ${c}`).toBe(true);
      expect(s.paper.width, kind).toBeGreaterThan(0);
      expect(s.screen.width, kind).toBeGreaterThan(0);
    }
  });

  // One look per kind: what the editor shows is what the sheet prints (colour, dash, hatch), except
  // the arm marks, which take one reach colour on screen and a colour per arm on paper.
  it('draws every kind alike on screen and on paper', () => {
    const css = readFileSync(new URL('../../../frontend/src/styles.css', import.meta.url), 'utf8');
    const hexOf = (colour: string): string | null => {
      const fallback = /var\(--[\w-]+,\s*(#[0-9a-f]{6})\)/i.exec(colour);
      if (fallback) return fallback[1].toLowerCase();
      const token = /var\((--[\w-]+)\)/.exec(colour);
      if (token) return new RegExp(`${token[1]}:\\s*(#[0-9a-f]{6})`, 'i').exec(css)?.[1].toLowerCase() ?? null;
      return /^#[0-9a-f]{6}$/i.test(colour) ? colour.toLowerCase() : null;
    };
    const hex = (rgb: readonly number[]) => `#${rgb.map((v) => v.toString(16).padStart(2, '0')).join('')}`;
    for (const [kind, s] of Object.entries(BOUNDARY_STYLES)) {
      if (s.paper.colour === 'arm') continue;
      const screen = hexOf(s.screen.colour);
      expect(screen, `${kind}: screen colour resolves`).not.toBeNull();
      expect(hex(s.paper.colour), `${kind}: paper colour = screen colour`).toBe(screen);
      expect('dash' in s.paper, `${kind}: dashed on paper as on screen`).toBe('dash' in s.screen);
      expect('hatch' in s.paper ? s.paper.hatch.angles.length : 0, `${kind}: one hatch direction as on screen`).toBe('hatch' in s.screen ? 1 : 0);
    }
    expect('dash' in BOUNDARY_STYLES.band.paper && 'dash' in BOUNDARY_STYLES.band.screen && BOUNDARY_STYLES.band.dxf.lineType === 'DASHED').toBe(true);
    // Red on paper means one thing: a work point no arm reaches.
    expect(BOUNDARY_STYLES.shared.paper.colour).not.toEqual(BOUNDARY_STYLES.pointUnreached.paper.colour);
  });
});
