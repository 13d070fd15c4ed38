import { describe, expect, it } from 'vitest';
import { ZONE_KINDS } from '@shared/schemas/layout';
import { ZONE_STYLES } from '@shared/style/zoneStyles';

// Consistency of the one style table; no outside source applies (these are the product's own choices).
describe('zone styles', () => {
  it('has a style for every zone kind the layout schema allows', () => {
    for (const kind of ZONE_KINDS) expect(ZONE_STYLES[kind], kind).toBeDefined();
  });

  it('gives kinds that share a DXF layer the same layer colour and line type', () => {
    const byLayer = new Map<string, { aci: number; lineType: string }>();
    for (const [kind, s] of Object.entries(ZONE_STYLES)) {
      const seen = byLayer.get(s.dxf.layer);
      if (seen) expect({ aci: s.dxf.aci, lineType: s.dxf.lineType }, `${kind} on ${s.dxf.layer}`).toEqual(seen);
      else byLayer.set(s.dxf.layer, { aci: s.dxf.aci, lineType: s.dxf.lineType });
    }
  });

  it('keeps paper colours within sRGB 0–255 and widths positive', () => {
    for (const [kind, s] of Object.entries(ZONE_STYLES)) {
      const colours = [s.paper.colour, 'legendColour' in s.paper ? s.paper.legendColour : undefined, 'label' in s.paper ? s.paper.label : undefined];
      for (const c of colours) if (Array.isArray(c)) for (const v of c) expect(Number.isInteger(v) && v >= 0 && v <= 255, `${kind}: ${c}`).toBe(true);
      expect(s.paper.width, kind).toBeGreaterThan(0);
      expect(s.screen.width, kind).toBeGreaterThan(0);
    }
  });
});
