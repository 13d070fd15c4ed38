/**
 * The placement map on the plan canvas: feasible cells shaded by worst margin (a d3 sequential
 * colour scale, drawn as one raster image in plan mm), infeasible cells left clear, the candidates
 * as numbered marks (screen px, clickable), and an auto-layout proposal's arms as dashed marks.
 * Pure drawing on the canvas' overlay groups; state stays with the React component.
 */
import { interpolateYlGnBu, scaleSequential, type ScaleSequential } from 'd3';
import type { PlacementCandidate, PlacementMap } from '@shared/analysis';
import type { PlanCanvas } from '../../plan/planTypes';

const MAP_OVERLAY = { name: 'placement-map', space: 'plan', order: 3 } as const;
const MARK_OVERLAY = { name: 'placement-marks', space: 'screen', order: 8 } as const;

/** The colour scale of a map: worst margin (mm) from its smallest to its largest feasible value; the low end kept light. */
export function marginScale(map: PlacementMap): ScaleSequential<string> {
  let lo = Infinity, hi = -Infinity;
  for (const v of map.worstMarginMm) {
    if (Number.isNaN(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (!(hi >= lo)) lo = hi = 0;
  if (hi - lo < 1) hi = lo + 1;
  return scaleSequential((t: number) => interpolateYlGnBu(0.2 + 0.8 * t)).domain([lo, hi]);
}

function mapImage(map: PlacementMap, scale: ScaleSequential<string>): string | null {
  if (typeof document === 'undefined' || map.cols === 0 || map.rows === 0) return null;
  const c = document.createElement('canvas');
  c.width = map.cols;
  c.height = map.rows;
  const g = c.getContext('2d');
  if (!g) return null;
  const img = g.createImageData(map.cols, map.rows);
  const parse = document.createElement('canvas').getContext('2d')!;
  const cache = new Map<string, [number, number, number]>();
  const rgb = (css: string) => {
    let v = cache.get(css);
    if (!v) {
      parse.fillStyle = css;
      const hex = String(parse.fillStyle);
      const m = /^#([0-9a-f]{2})([0-9a-f]{2})([0-9a-f]{2})$/i.exec(hex);
      v = m ? [parseInt(m[1], 16), parseInt(m[2], 16), parseInt(m[3], 16)] : [0, 128, 128];
      cache.set(css, v);
    }
    return v;
  };
  // Pixel row j is map row j (south first): the plan frame mirrors y, which puts it at the bottom.
  for (let k = 0; k < map.worstMarginMm.length; k++) {
    const v = map.worstMarginMm[k];
    if (Number.isNaN(v)) continue;
    const [r, gg, b] = rgb(scale(v));
    img.data[4 * k] = r;
    img.data[4 * k + 1] = gg;
    img.data[4 * k + 2] = b;
    img.data[4 * k + 3] = 190;
  }
  g.putImageData(img, 0, 0);
  return c.toDataURL();
}

export interface PlacementMarks {
  candidates: ReadonlyArray<PlacementCandidate>;
  /** Proposed arms of an auto-layout (plan mm, yaw deg). */
  proposed: ReadonlyArray<{ id: string; x: number; y: number }>;
  onPick(index: number): void;
}

/** Draws (or, with null, removes) the map (plan mm: it follows zoom and pan by itself). */
export function drawPlacementMap(canvas: PlanCanvas, map: PlacementMap | null): void {
  if (!map) canvas.removeOverlay(MAP_OVERLAY.name);
  else {
    const href = mapImage(map, marginScale(map));
    canvas.setOverlay(MAP_OVERLAY.name, (layer) => {
      layer.attr('data-placement-map', `${map.cols}x${map.rows}`).attr('pointer-events', 'none');
      const img = layer.selectAll<SVGImageElement, string>('image').data(href ? [href] : []);
      img.exit().remove();
      img.enter().append('image').merge(img)
        .attr('href', (d) => d)
        .attr('x', map.origin[0])
        .attr('y', map.origin[1])
        .attr('width', map.cols * map.gridMm)
        .attr('height', map.rows * map.gridMm)
        .attr('preserveAspectRatio', 'none')
        .style('image-rendering', 'pixelated');
    }, MAP_OVERLAY);
  }
}

/** Draws (or, with null, removes) the candidate and proposal marks (screen px: call again on every view change). */
export function drawPlacementMarks(canvas: PlanCanvas, marks: PlacementMarks | null): void {
  if (!marks || (marks.candidates.length === 0 && marks.proposed.length === 0)) {
    canvas.removeOverlay(MARK_OVERLAY.name);
    return;
  }
  canvas.setOverlay(MARK_OVERLAY.name, (layer, view) => {
    const cand = layer.selectAll<SVGGElement, PlacementCandidate>('g.placement-candidate').data(marks.candidates);
    cand.exit().remove();
    const enter = cand.enter().append('g').attr('class', 'placement-candidate').style('cursor', 'pointer');
    enter.append('circle').attr('r', 9).attr('fill', 'var(--color-paper-raised, #fff)').attr('stroke', 'var(--color-ink, #222)').attr('stroke-width', 2);
    enter.append('text').attr('text-anchor', 'middle').attr('dy', '0.35em').attr('font-size', 11).attr('font-weight', 700);
    const all = enter.merge(cand);
    all.attr('transform', (d) => `translate(${view.toScreen({ x: d.x, y: d.y }).join(',')})`)
      .attr('data-candidate', (_d, i) => String(i + 1))
      .on('click', (event: MouseEvent, d) => {
        event.stopPropagation();
        marks.onPick(marks.candidates.indexOf(d));
      });
    all.select('text').text((_d, i) => String(i + 1));
    all.select('title').remove();
    all.append('title').text((d, i) => `Candidate ${i + 1}: worst margin ${d.worstMarginMm.toFixed(0)} mm, yaw ${d.yawDeg}°`);

    const prop = layer.selectAll<SVGGElement, { id: string; x: number; y: number }>('g.placement-proposed').data(marks.proposed, (d) => d.id);
    prop.exit().remove();
    const pe = prop.enter().append('g').attr('class', 'placement-proposed').attr('pointer-events', 'none');
    pe.append('circle').attr('r', 12).attr('fill', 'none').attr('stroke', 'var(--color-ink, #222)').attr('stroke-width', 2).attr('stroke-dasharray', '4 3');
    pe.append('text').attr('y', -16).attr('text-anchor', 'middle').attr('font-size', 11);
    const pall = pe.merge(prop);
    pall.attr('transform', (d) => `translate(${view.toScreen({ x: d.x, y: d.y }).join(',')})`);
    pall.select('text').text((d) => `${d.id} (proposed)`);
  }, MARK_OVERLAY);
}

/** The map cell under a plan point, or −1. */
export function cellAt(map: PlacementMap, x: number, y: number): number {
  const i = Math.floor((x - map.origin[0]) / map.gridMm);
  const j = Math.floor((y - map.origin[1]) / map.gridMm);
  return i >= 0 && j >= 0 && i < map.cols && j < map.rows ? j * map.cols + i : -1;
}
