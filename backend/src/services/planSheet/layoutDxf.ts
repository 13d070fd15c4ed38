import Drawing from 'dxf-writer';
import { geoJSONToPolygons } from '@shared/geometry';
import type { Polygon2 } from '@shared/geometry';
import { BOUNDARY_STYLES, type DxfLook } from '@shared/style/boundaryStyles';
import { summarizeArms } from './armSummary';
import { moveDxfEntities } from './dxfOrigin';
import type { PlanSheetInput } from './types';
import { BOUNDARY_KIND_WORD, layoutStateWords } from '@shared/words';
import { exportNotes } from '@shared/safety';

/** Layer names of the exported layout (CAD side). */
export const DXF_LAYERS = {
  arms: BOUNDARY_STYLES.armBase.dxf.layer,
  maxSpace: BOUNDARY_STYLES.maxSpace.dxf.layer,
  restricted: BOUNDARY_STYLES.restricted.dxf.layer,
  band: (h: number) => `${BOUNDARY_STYLES.band.dxf.layer}_${Math.round(h)}`,
  shared: BOUNDARY_STYLES.shared.dxf.layer,
  points: BOUNDARY_STYLES.pointReached.dxf.layer,
  fences: BOUNDARY_STYLES.fence.dxf.layer,
  /** Openings, operator areas and keep-outs share one layer. */
  boundaries: BOUNDARY_STYLES.keepout.dxf.layer,
  /** What the file is, its state and date, the frame and the cautions, as text below the plan. */
  notes: 'RF_NOTES',
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
 * The lowest-left corner of what the export draws (the layout's own elements and the arms' maximum
 * spaces; the floor plan's corner when the layout is empty), plan mm: the notes go below it, at
 * its left edge.
 */
function lowerLeft(input: PlanSheetInput, spaces: ReadonlyArray<Polygon2>): [number, number] {
  const c = input.layout.content;
  const pts: Array<readonly [number, number]> = [
    ...c.arms.map((a) => [a.x, a.y] as const),
    ...c.workPoints.map((p) => [p.x, p.y] as const),
    ...c.boundaries.flatMap((b) => b.points),
    ...spaces.flatMap((p) => p.flat()),
  ];
  if (!pts.length) return input.floorPlan ? [input.floorPlan.bounds.minX, input.floorPlan.bounds.minY] : [0, 0];
  let x = Infinity;
  let y = Infinity;
  for (const [px, py] of pts) {
    x = Math.min(x, px);
    y = Math.min(y, py);
  }
  return [x, y];
}

/**
 * The layout as DXF for CAD, plan mm ($INSUNITS 4): arm bases (circle, label at the base point),
 * maximum and restricted space outlines, reach bands per work height, shared zones, work points
 * (circle, id at the point), fences and the other boundaries, each on its named layer; the notes
 * (what, state — working copy or revision — date, frame, cautions) as 999 comments at the top of the
 * file and as text on RF_NOTES below the plan.
 */
export function layoutDxf(input: PlanSheetInput, opts: { createdAt: Date }): string {
  const d = new Drawing();
  d.setUnits('Millimeters');
  const content = input.layout.content;
  const layer = (name: string, look: DxfLook) => d.addLayer(name, look.aci, look.lineType);
  layer(DXF_LAYERS.arms, BOUNDARY_STYLES.armBase.dxf);
  layer(DXF_LAYERS.maxSpace, BOUNDARY_STYLES.maxSpace.dxf);
  layer(DXF_LAYERS.restricted, BOUNDARY_STYLES.restricted.dxf);
  for (const h of content.workHeights) layer(DXF_LAYERS.band(h), BOUNDARY_STYLES.band.dxf);
  layer(DXF_LAYERS.shared, BOUNDARY_STYLES.shared.dxf);
  layer(DXF_LAYERS.points, BOUNDARY_STYLES.pointReached.dxf);
  layer(DXF_LAYERS.fences, BOUNDARY_STYLES.fence.dxf);
  layer(DXF_LAYERS.boundaries, BOUNDARY_STYLES.keepout.dxf);
  d.addLayer(DXF_LAYERS.notes, 7, 'CONTINUOUS');

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
  for (const s of input.analysis.sharedZones) rings(d, geoJSONToPolygons(s.geometry));
  d.setActiveLayer(DXF_LAYERS.points);
  for (const p of content.workPoints) {
    d.drawCircle(round(p.x), round(p.y), DXF_POINT_RADIUS_MM);
    d.drawText(round(p.x), round(p.y), TEXT_MM / 2, 0, dxfText(p.id));
  }
  for (const z of content.boundaries) {
    d.setActiveLayer(BOUNDARY_STYLES[z.kind].dxf.layer);
    const pts = z.points.map(([x, y]) => [round(x), round(y)] as [number, number]);
    d.drawPolyline(pts, z.kind === 'keepout' || z.kind === 'operator');
    const [x, y] = pts[0];
    d.drawText(x, y, TEXT_MM / 2, 0, dxfText(`${z.id} ${BOUNDARY_KIND_WORD[z.kind]}${z.height ? `, height ${Math.round(z.height)} mm` : ''}`));
  }
  const notes = exportNotes({
    what: 'cell layout drawing',
    layoutName: dxfText(input.layout.name),
    state: layoutStateWords(input.revision ? { letter: input.revision.letter, state: input.revision.state } : null),
    at: opts.createdAt,
  }).map(dxfText);
  d.setActiveLayer(DXF_LAYERS.notes);
  const [nx, ny] = lowerLeft(input, arms.flatMap((a) => a.maxSpace));
  notes.forEach((n, i) => d.drawText(round(nx), round(ny - 2 * TEXT_MM * (i + 2)), TEXT_MM, 0, n));
  // back to where the building lies in its own drawing (see the floor plan's local origin)
  const o = input.floorPlan?.origin;
  const body = o ? moveDxfEntities(d.toDxfString(), o.x, o.y) : d.toDxfString();
  return notes.map((n) => `999\n${n}\n`).join('') + body;
}
