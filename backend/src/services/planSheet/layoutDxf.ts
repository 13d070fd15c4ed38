import Drawing from 'dxf-writer';
import { geoJSONToPolygons } from '@shared/geometry/geojson';
import type { Polygon2 } from '@shared/geometry/types';
import { summarizeArms } from './armSummary';
import type { PlanSheetInput } from './types';

/** Layer names of the exported layout (CAD side). */
export const DXF_LAYERS = {
  arms: 'RF_ARMS',
  maxSpace: 'RF_MAX_SPACE',
  restricted: 'RF_RESTRICTED',
  band: (h: number) => `RF_BAND_${Math.round(h)}`,
  shared: 'RF_SHARED',
  points: 'RF_POINTS',
  fences: 'RF_FENCES',
  zones: 'RF_ZONES',
} as const;

/** Radius of the arm-base circle, plan mm. */
export const DXF_BASE_RADIUS_MM = 200;
/** Radius of the work-point circle, plan mm. */
export const DXF_POINT_RADIUS_MM = 40;
const TEXT_MM = 150;

const round = (v: number) => Math.round(v * 1000) / 1000;

/**
 * Text as one DXF value: every run of control characters (Unicode Cc, CR and LF among them)
 * becomes one space. A DXF file is one group code and one value per line, so a line break inside
 * a label would start records of its own; the schemas refuse such names already, this holds for
 * anything stored before they did.
 */
export function dxfText(s: string): string {
  return s.replace(/\p{Cc}+/gu, ' ');
}

function rings(d: Drawing, polygons: ReadonlyArray<Polygon2>): void {
  for (const p of polygons) for (const ring of p) if (ring.length >= 3) d.drawPolyline(ring.map(([x, y]) => [round(x), round(y)]), true);
}

/**
 * The layout as DXF for CAD, plan mm ($INSUNITS 4): arm bases (circle, label at the base point),
 * maximum and restricted space outlines, reach bands per work height, shared zones, work points
 * (circle, id at the point), fences and the other zones, each on its named layer.
 */
export function layoutDxf(input: PlanSheetInput): string {
  const d = new Drawing();
  d.setUnits('Millimeters');
  const content = input.layout.content;
  d.addLayer(DXF_LAYERS.arms, Drawing.ACI.BLUE, 'CONTINUOUS');
  d.addLayer(DXF_LAYERS.maxSpace, Drawing.ACI.CYAN, 'DASHED');
  d.addLayer(DXF_LAYERS.restricted, Drawing.ACI.BLUE, 'CONTINUOUS');
  for (const h of content.workHeights) d.addLayer(DXF_LAYERS.band(h), Drawing.ACI.GREEN, 'CONTINUOUS');
  d.addLayer(DXF_LAYERS.shared, Drawing.ACI.RED, 'CONTINUOUS');
  d.addLayer(DXF_LAYERS.points, Drawing.ACI.MAGENTA, 'CONTINUOUS');
  d.addLayer(DXF_LAYERS.fences, Drawing.ACI.WHITE, 'CONTINUOUS');
  d.addLayer(DXF_LAYERS.zones, Drawing.ACI.YELLOW, 'CONTINUOUS');

  const arms = summarizeArms({ models: input.models, analysis: input.analysis, content });
  d.setActiveLayer(DXF_LAYERS.arms);
  for (const a of arms) {
    d.drawCircle(round(a.arm.x), round(a.arm.y), DXF_BASE_RADIUS_MM);
    d.drawText(round(a.arm.x), round(a.arm.y), TEXT_MM, 0, dxfText(a.title));
  }
  d.setActiveLayer(DXF_LAYERS.maxSpace);
  for (const a of arms) rings(d, a.maxSpace);
  d.setActiveLayer(DXF_LAYERS.restricted);
  for (const a of arms) rings(d, a.restricted);
  for (const h of content.workHeights) {
    d.setActiveLayer(DXF_LAYERS.band(h));
    for (const a of content.arms) {
      const band = input.analysis.regions[a.id]?.bands.find((b) => b.height === h);
      rings(d, geoJSONToPolygons(band?.geometry ?? null));
    }
  }
  d.setActiveLayer(DXF_LAYERS.shared);
  for (const s of input.analysis.overlaps) rings(d, geoJSONToPolygons(s.geometry));
  d.setActiveLayer(DXF_LAYERS.points);
  for (const p of content.workPoints) {
    d.drawCircle(round(p.x), round(p.y), DXF_POINT_RADIUS_MM);
    d.drawText(round(p.x), round(p.y), TEXT_MM / 2, 0, dxfText(p.id));
  }
  for (const z of content.zones) {
    d.setActiveLayer(z.kind === 'fence' ? DXF_LAYERS.fences : DXF_LAYERS.zones);
    const pts = z.points.map(([x, y]) => [round(x), round(y)] as [number, number]);
    d.drawPolyline(pts, z.kind === 'keepout' || z.kind === 'operator');
    const [x, y] = pts[0];
    d.drawText(x, y, TEXT_MM / 2, 0, dxfText(`${z.id} ${z.kind}${z.height ? ` h ${Math.round(z.height)}` : ''}`));
  }
  return d.toDxfString();
}
