/**
 * Drawing of the section (side view along a line on the plan) into one svg: true to scale, s (mm
 * along the line from A) to the right and z (mm above the floor) up. d3 joins only; the numbers
 * come from the worker (shared/analysis/section.ts), nothing is computed here but the view scale.
 */
import { select, type Selection } from 'd3';
import type { SectionDimension, SectionResult } from '@shared/analysis';

/** Colours of the arms' cuts, by the arm's place in the layout (the first is the plan's reach blue). */
export const SECTION_ARM_COLOURS = ['#3a78c2', '#c2562f', '#2f8a5b', '#b0457a', '#a0671a', '#2a8fa3'] as const;

const INK = 'var(--color-ink, #1c2230)';
const MUTED = 'var(--color-ink-muted, #586173)';
const STRUCTURE = 'var(--color-plan-wall, #44403a)';
const FENCE = 'var(--color-boundary-fence, #1c2230)';
const DIM = 'var(--color-accent-strong, #07524e)';
const HATCH_ID = 'rf-section-hatch';
const ARROW_ID = 'rf-section-arrow';

const PAD = { left: 56, right: 24, top: 30, bottom: 52 };
/** Height shown above the tallest thing in the view, mm, and the least height shown. */
const HEADROOM_MM = 400;
const MIN_VIEW_Z_MM = 2500;

export interface SectionDrawOptions {
  width: number;
  height: number;
  /** Arm id → colour. */
  colourOf(armId: string): string;
  /** Arm id → label shown beside its cut. */
  labelOf(armId: string): string;
}

const mm = (v: number) => `${Math.round(v)}`;

/** A tidy scale-bar length in metres for about `targetMm`. */
function niceMetres(targetMm: number): number {
  const steps = [0.25, 0.5, 1, 2, 5, 10, 20];
  const m = targetMm / 1000;
  return steps.reduce((best, s) => (Math.abs(s - m) < Math.abs(best - m) ? s : best), steps[0]);
}

/** Draws the section into `svg` (replacing what was there). */
export function drawSection(svg: SVGSVGElement, r: SectionResult, o: SectionDrawOptions): void {
  const root = select(svg);
  root.selectAll('*').remove();
  root.attr('width', o.width).attr('height', o.height).attr('viewBox', `0 0 ${o.width} ${o.height}`);

  let zTop = MIN_VIEW_Z_MM;
  // Nothing is reached below the floor: the view (and the cuts, by a clip) start at z = 0.
  const zBottom = 0;
  for (const st of r.structures) if (st.top !== null) zTop = Math.max(zTop, st.top);
  for (const f of r.fences) zTop = Math.max(zTop, f.height);
  for (const c of r.arms) zTop = Math.max(zTop, c.zMax);
  zTop += HEADROOM_MM;
  const innerW = Math.max(10, o.width - PAD.left - PAD.right);
  const innerH = Math.max(10, o.height - PAD.top - PAD.bottom);
  // One scale for s and z: a side view is read at true proportions.
  const k = Math.min(innerW / r.lengthMm, innerH / (zTop - zBottom));
  const x0 = PAD.left + (innerW - k * r.lengthMm) / 2;
  const yFloor = PAD.top + innerH - -zBottom * k;
  const X = (s: number) => x0 + s * k;
  const Y = (z: number) => yFloor - z * k;
  const yTop = Y(zTop);

  const defs = root.append('defs');
  const CLIP_ID = 'rf-section-above-floor';
  defs.append('clipPath').attr('id', CLIP_ID).append('rect').attr('x', 0).attr('y', 0).attr('width', o.width).attr('height', Y(0));
  defs
    .append('pattern')
    .attr('id', HATCH_ID)
    .attr('patternUnits', 'userSpaceOnUse')
    .attr('width', 6)
    .attr('height', 6)
    .attr('patternTransform', 'rotate(45)')
    .append('path')
    .attr('d', 'M0,0V6')
    .style('stroke', STRUCTURE)
    .style('stroke-width', 1.2);
  defs
    .append('marker')
    .attr('id', ARROW_ID)
    .attr('viewBox', '0 0 10 10')
    .attr('refX', 10)
    .attr('refY', 5)
    .attr('markerWidth', 7)
    .attr('markerHeight', 7)
    .attr('orient', 'auto-start-reverse')
    .append('path')
    .attr('d', 'M0,1L10,5L0,9z')
    .style('fill', DIM);

  const text = (g: Selection<SVGGElement, unknown, null, undefined>, x: number, y: number, t: string, anchor: 'start' | 'middle' | 'end' = 'middle', colour: string = INK, weight = 700) =>
    g
      .append('text')
      .attr('x', x)
      .attr('y', y)
      .attr('text-anchor', anchor)
      .attr('paint-order', 'stroke')
      .style('font', `${weight} 11px var(--font-sans, sans-serif)`)
      .style('fill', colour)
      .style('stroke', 'var(--color-paper-raised, #fff)')
      .style('stroke-width', 3)
      .text(t);

  // Floor: a heavy line over the floor extent, with short ground ticks beneath.
  const floor = root.append('g').attr('data-section-floor', '');
  for (const [s0, s1] of r.floor) {
    floor.append('line').attr('x1', X(s0)).attr('x2', X(s1)).attr('y1', Y(0)).attr('y2', Y(0)).style('stroke', INK).style('stroke-width', 2);
    const ticks: string[] = [];
    for (let x = X(s0); x <= X(s1) - 6; x += 9) ticks.push(`M${x},${Y(0) + 1}l6,6`);
    floor.append('path').attr('d', ticks.join('')).style('stroke', MUTED).style('stroke-width', 1);
  }

  // Structure pieces: hatched from the floor to their top; full height runs off the top of the view.
  const st = root.append('g').attr('data-section-structures', '');
  for (const piece of r.structures) {
    const w = Math.max(3, (piece.s[1] - piece.s[0]) * k);
    const x = (X(piece.s[0]) + X(piece.s[1])) / 2 - w / 2;
    const top = piece.top === null ? yTop : Y(piece.top);
    st.append('rect')
      .attr('data-structure', piece.id)
      .attr('x', x)
      .attr('y', top)
      .attr('width', w)
      .attr('height', Y(0) - top)
      .style('fill', `url(#${HATCH_ID})`)
      .style('stroke', STRUCTURE)
      .style('stroke-width', 1);
    text(st, x + w / 2, top - 5, piece.top === null ? `${piece.role} · full height` : `${piece.role} ${mm(piece.top)}`, 'middle', STRUCTURE, 400);
  }

  // Arms' cuts, filled in their colours and labelled at their highest point.
  const arms = root.append('g').attr('data-section-arms', '').attr('clip-path', `url(#${CLIP_ID})`);
  for (const cut of r.arms) {
    const colour = o.colourOf(cut.id);
    const d = cut.polygons.map((poly) => poly.map((ring) => ring.map(([s, z], i) => `${i ? 'L' : 'M'}${X(s).toFixed(1)},${Y(z).toFixed(1)}`).join('') + 'Z').join('')).join('');
    arms.append('path').attr('data-section-cut', cut.id).attr('d', d).attr('fill-rule', 'evenodd').style('fill', colour).style('fill-opacity', 0.3).style('stroke', colour).style('stroke-width', 1.5);
    const [s0] = cut.spans[0];
    const s1 = cut.spans[cut.spans.length - 1][1];
    text(arms, X((s0 + s1) / 2), Y(cut.zMax) - 6, o.labelOf(cut.id), 'middle', colour);
  }

  // Openings: a thin dashed mark; fences: solid bars to their height.
  const fences = root.append('g').attr('data-section-fences', '');
  for (const op of r.openings) {
    fences.append('line').attr('x1', X(op.s)).attr('x2', X(op.s)).attr('y1', Y(0)).attr('y2', Y(2000)).style('stroke', FENCE).style('stroke-width', 1).style('stroke-dasharray', '3 3');
    text(fences, X(op.s), Y(2000) - 5, `${op.label} (opening)`, 'middle', MUTED, 400);
  }
  for (const f of r.fences) {
    fences.append('rect').attr('data-section-fence', f.id).attr('x', X(f.s) - 2.5).attr('y', Y(f.height)).attr('width', 5).attr('height', Y(0) - Y(f.height)).style('fill', FENCE);
    text(fences, X(f.s), Y(f.height) - 6, f.label, 'middle', FENCE);
  }

  // Dimensions at each fence: b its height, a the highest point of the arms' space, c the gap in s.
  const dims = root.append('g').attr('data-section-dimensions', '');
  const dimLine = (xa: number, ya: number, xb: number, yb: number) =>
    dims.append('line').attr('x1', xa).attr('y1', ya).attr('x2', xb).attr('y2', yb).style('stroke', DIM).style('stroke-width', 1.2).attr('marker-start', `url(#${ARROW_ID})`).attr('marker-end', `url(#${ARROW_ID})`);
  const witness = (xa: number, ya: number, xb: number, yb: number) =>
    dims.append('line').attr('x1', xa).attr('y1', ya).attr('x2', xb).attr('y2', yb).style('stroke', DIM).style('stroke-width', 0.8).style('stroke-dasharray', '2 2');
  // Heights are written along their dimension lines, reading upwards.
  const upright = (x: number, y0: number, y1: number, t: string) => text(dims, x, (y0 + y1) / 2, t, 'middle', DIM).attr('transform', `rotate(-90 ${x} ${(y0 + y1) / 2})`);
  r.dimensions.forEach((d: SectionDimension) => {
    const fx = X(d.s);
    // From the fence towards the arm's space (+1 = towards larger s); at c = 0 towards the middle of that arm's cut.
    const cut = r.arms.find((c) => c.id === d.armId);
    const middle = cut ? (cut.spans[0][0] + cut.spans[cut.spans.length - 1][1]) / 2 : d.s + 1;
    const toward = d.toS === null ? 1 : Math.sign(d.toS - d.s) || Math.sign(middle - d.s) || 1;
    // b: beside the fence, on the side away from the arm.
    const bx = fx - toward * 14;
    dimLine(bx, Y(0), bx, Y(d.b));
    upright(bx - toward * (toward > 0 ? 4 : 12), Y(0), Y(d.b), `b ${mm(d.b)}`);
    if (d.a === null || d.c === null || d.toS === null) return;
    // a: just outside the arm's nearest boundary, from the floor to the highest point of the arms' space.
    const ax = d.c > 0 ? X(d.toS) - toward * 12 : fx + toward * 14;
    witness(X(d.toS), Y(d.a), ax - toward * 4, Y(d.a));
    dimLine(ax, Y(0), ax, Y(d.a));
    upright(ax + toward * (toward > 0 ? 12 : 4), Y(0), Y(d.a), `a ${mm(d.a)}`);
    // c: at two thirds of the lower of the two heights, from the fence to the nearest boundary of an arm's space.
    const cy = Y((2 / 3) * Math.min(d.b, d.a));
    if (d.c > 0) {
      witness(X(d.toS), Y(0), X(d.toS), cy - 4);
      dimLine(fx, cy, X(d.toS), cy);
      text(dims, (fx + X(d.toS)) / 2, cy + 14, `c ${mm(d.c)}`, 'middle', DIM);
    } else {
      text(dims, fx + toward * 22, cy, 'c 0 — the space reaches the fence', toward > 0 ? 'start' : 'end', 'var(--color-finding-critical, #b42318)');
    }
  });

  // Ends of the line and the scale in metres.
  const frame = root.append('g');
  text(frame, X(0), Y(0) + 18, 'A', 'middle', INK);
  text(frame, X(r.lengthMm), Y(0) + 18, 'A′', 'middle', INK);
  const barM = niceMetres(r.lengthMm * 0.3);
  const barPx = barM * 1000 * k;
  const by = o.height - 14;
  const bar = frame.append('g').attr('data-section-scale', '');
  const halves = [0, 1].map((h) => bar.append('rect').attr('x', x0 + (h * barPx) / 2).attr('y', by - 5).attr('width', barPx / 2).attr('height', 5).style('stroke', INK).style('stroke-width', 0.8));
  halves[0].style('fill', INK);
  halves[1].style('fill', 'var(--color-paper-raised, #fff)');
  text(bar, x0, by + 11, '0', 'middle', INK, 400);
  text(bar, x0 + barPx, by + 11, `${barM} m`, 'middle', INK, 400);
  // A height scale on the left: ticks every metre.
  const axis = frame.append('g');
  const ax0 = Math.max(PAD.left - 20, x0 - 40);
  for (let z = 0; z <= zTop; z += 1000) {
    axis.append('line').attr('x1', ax0 - 3).attr('x2', ax0 + 3).attr('y1', Y(z)).attr('y2', Y(z)).style('stroke', MUTED);
    text(axis, ax0 - 7, Y(z) + 4, `${z / 1000} m`, 'end', MUTED, 400);
  }
  axis.append('line').attr('x1', ax0).attr('x2', ax0).attr('y1', Y(0)).attr('y2', Y(Math.floor(zTop / 1000) * 1000)).style('stroke', MUTED);
}
