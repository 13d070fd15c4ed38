/**
 * The side reach profile drawing (d3, no React): the (r, z) region of the tool point in the arm's
 * vertical plane, r horizontal (negative = behind the J1 axis), z up, equal scale on both axes,
 * a millimetre grid from the 1-2-5 series, the J1 axis and base plate, max/min reach marks, the
 * stated tolerance, and optionally the arm in one pose as a polyline of its joints.
 * React owns the data; this module owns everything under the one svg it is given.
 */
import * as d3 from 'd3';
import type { Polygon2 } from '@shared/kinematics';
import { niceStepAtLeast } from '../../plan/scaleBar';

/** What the drawing shows of a profile; lengths mm in the arm frame. */
export interface ProfileView {
  polygons: Polygon2[];
  maxReach: number;
  minReach: number;
  toleranceMm: number;
  method: string;
  /** The whole-arm envelope (links, tool, payload) in the same (r, z) frame, drawn as a second outline. */
  envelope?: Polygon2[] | null;
  envelopeToleranceMm?: number;
}

/** The arm in one pose, in the side view: joint positions (r, z) mm from base to tool. */
export interface PoseView {
  points: Array<[number, number]>;
  /** False when the pose is out of limits or does not assemble: drawn greyed. */
  ok: boolean;
}

export interface ProfileDrawing {
  /** Redraws with a new profile and/or pose; `stale` fades the profile (the form does not parse). */
  update(profile: ProfileView | null, pose: PoseView | null, opts?: { stale?: boolean }): void;
  /** The drawing's size in px changed. */
  resize(width: number, height: number): void;
  destroy(): void;
}

const MARGIN = { top: 28, right: 20, bottom: 44, left: 64 };
const mm = new Intl.NumberFormat('en-GB', { maximumFractionDigits: 0 });

/** "1 412 mm" — a length for labels (thin space thousands separator kept plain for reading aloud). */
export function formatMm(value: number): string {
  return `${mm.format(Math.round(value)).replace(/,/g, ' ')} mm`;
}

/** "±14 mm", "±0.5 mm", or "exact" for a boundary with no stated error. */
export function formatTolerance(toleranceMm: number): string {
  if (toleranceMm < 0.05) return 'exact';
  return toleranceMm < 10 ? `±${toleranceMm.toFixed(1)} mm` : `±${formatMm(toleranceMm)}`;
}

/** SVG path data of polygons (outer ring then holes; even-odd fill) through the two scales. */
export function polygonsPath(polygons: readonly Polygon2[], x: (r: number) => number, y: (z: number) => number): string {
  let d = '';
  for (const poly of polygons) {
    for (const ring of poly) {
      if (ring.length < 3) continue;
      d += ring.map(([r, z], i) => `${i === 0 ? 'M' : 'L'}${x(r).toFixed(2)},${y(z).toFixed(2)}`).join('') + 'Z';
    }
  }
  return d;
}

/** Extent [rMin, rMax, zMin, zMax] of the profile, the pose and the base (origin), mm. */
function extentOf(profile: ProfileView | null, pose: PoseView | null): [number, number, number, number] {
  let r0 = 0, r1 = 0, z0 = 0, z1 = 0;
  const take = (r: number, z: number) => {
    if (!Number.isFinite(r) || !Number.isFinite(z)) return;
    r0 = Math.min(r0, r);
    r1 = Math.max(r1, r);
    z0 = Math.min(z0, z);
    z1 = Math.max(z1, z);
  };
  for (const poly of profile?.polygons ?? []) for (const ring of poly) for (const [r, z] of ring) take(r, z);
  for (const poly of profile?.envelope ?? []) for (const ring of poly) for (const [r, z] of ring) take(r, z);
  for (const [r, z] of pose?.points ?? []) take(r, z);
  if (r1 - r0 < 100) r1 = r0 + 100;
  if (z1 - z0 < 100) z1 = z0 + 100;
  return [r0, r1, z0, z1];
}

/** Creates the drawing in `svg` (which it empties). */
export function createProfileDrawing(svg: SVGSVGElement): ProfileDrawing {
  const root = d3.select(svg);
  root.selectAll('*').remove();
  let width = svg.clientWidth || 640;
  let height = svg.clientHeight || 420;
  let last: { profile: ProfileView | null; pose: PoseView | null; stale: boolean } = { profile: null, pose: null, stale: false };

  const gGrid = root.append('g').attr('class', 'grid');
  const gAxes = root.append('g').attr('class', 'axes');
  const envelope = root.append('path').attr('class', 'envelope').attr('fill-rule', 'evenodd');
  const region = root.append('path').attr('class', 'profile').attr('fill-rule', 'evenodd');
  const gLegend = root.append('g').attr('class', 'legend');
  const gMarks = root.append('g').attr('class', 'marks');
  const gPose = root.append('g').attr('class', 'pose');
  const caption = root.append('text').attr('class', 'caption').attr('x', MARGIN.left).attr('y', 16).attr('font-size', 12).attr('fill', 'var(--color-ink-muted)');

  function draw() {
    const { profile, pose, stale } = last;
    root.attr('viewBox', `0 0 ${width} ${height}`).attr('width', width).attr('height', height);
    const [r0, r1, z0, z1] = extentOf(profile, pose);
    const padR = (r1 - r0) * 0.06, padZ = (z1 - z0) * 0.06;
    const innerW = Math.max(10, width - MARGIN.left - MARGIN.right);
    const innerH = Math.max(10, height - MARGIN.top - MARGIN.bottom);
    // Equal scale on both axes: a millimetre is as long across as up.
    const pxPerMm = Math.min(innerW / (r1 - r0 + 2 * padR), innerH / (z1 - z0 + 2 * padZ));
    const rMid = (r0 + r1) / 2, zMid = (z0 + z1) / 2;
    const x = (r: number) => MARGIN.left + innerW / 2 + (r - rMid) * pxPerMm;
    const y = (z: number) => MARGIN.top + innerH / 2 - (z - zMid) * pxPerMm;
    const rLo = rMid - innerW / 2 / pxPerMm, rHi = rMid + innerW / 2 / pxPerMm;
    const zLo = zMid - innerH / 2 / pxPerMm, zHi = zMid + innerH / 2 / pxPerMm;

    const step = niceStepAtLeast(pxPerMm, 48);
    const rTicks = d3.range(Math.ceil(rLo / step) * step, rHi + 1e-9, step);
    const zTicks = d3.range(Math.ceil(zLo / step) * step, zHi + 1e-9, step);
    gGrid
      .selectAll<SVGLineElement, number>('line.r')
      .data(rTicks, (d) => d)
      .join('line')
      .attr('class', 'r')
      .attr('x1', (d) => x(d))
      .attr('x2', (d) => x(d))
      .attr('y1', MARGIN.top)
      .attr('y2', MARGIN.top + innerH)
      .attr('stroke', 'var(--color-plan-grid)');
    gGrid
      .selectAll<SVGLineElement, number>('line.z')
      .data(zTicks, (d) => d)
      .join('line')
      .attr('class', 'z')
      .attr('x1', MARGIN.left)
      .attr('x2', MARGIN.left + innerW)
      .attr('y1', (d) => y(d))
      .attr('y2', (d) => y(d))
      .attr('stroke', 'var(--color-plan-grid)');

    gAxes.selectAll('*').remove();
    const tickText = (sel: d3.Selection<SVGTextElement, number, SVGGElement, unknown>) =>
      sel.attr('font-size', 11).attr('fill', 'var(--color-ink-muted)').attr('font-variant-numeric', 'tabular-nums');
    gAxes
      .selectAll<SVGTextElement, number>('text.rt')
      .data(rTicks)
      .join('text')
      .attr('class', 'rt')
      .attr('x', (d) => x(d))
      .attr('y', MARGIN.top + innerH + 14)
      .attr('text-anchor', 'middle')
      .text((d) => mm.format(d).replace(/,/g, ' '))
      .call(tickText);
    gAxes
      .selectAll<SVGTextElement, number>('text.zt')
      .data(zTicks)
      .join('text')
      .attr('class', 'zt')
      .attr('x', MARGIN.left - 6)
      .attr('y', (d) => y(d) + 4)
      .attr('text-anchor', 'end')
      .text((d) => mm.format(d).replace(/,/g, ' '))
      .call(tickText);
    gAxes
      .append('text')
      .attr('x', MARGIN.left + innerW / 2)
      .attr('y', height - 8)
      .attr('text-anchor', 'middle')
      .attr('font-size', 12)
      .attr('fill', 'var(--color-ink)')
      .text('r, mm from the J1 axis (negative = behind J1)');
    gAxes
      .append('text')
      .attr('transform', `translate(14, ${MARGIN.top + innerH / 2}) rotate(-90)`)
      .attr('text-anchor', 'middle')
      .attr('font-size', 12)
      .attr('fill', 'var(--color-ink)')
      .text('z, mm above the base plate');
    // J1 axis and base plate.
    gAxes
      .append('line')
      .attr('x1', x(0))
      .attr('x2', x(0))
      .attr('y1', MARGIN.top)
      .attr('y2', MARGIN.top + innerH)
      .attr('stroke', 'var(--color-ink-faint)')
      .attr('stroke-dasharray', '8 3 2 3');
    gAxes
      .append('text')
      .attr('x', x(0) + 4)
      .attr('y', MARGIN.top + 12)
      .attr('font-size', 11)
      .attr('fill', 'var(--color-ink-muted)')
      .text('J1');
    gAxes
      .append('line')
      .attr('x1', MARGIN.left)
      .attr('x2', MARGIN.left + innerW)
      .attr('y1', y(0))
      .attr('y2', y(0))
      .attr('stroke', 'var(--color-ink-faint)');

    region
      .attr('d', profile ? polygonsPath(profile.polygons, x, y) : '')
      .attr('fill', 'var(--color-reach)')
      .attr('fill-opacity', stale ? 0.08 : 0.2)
      .attr('stroke', 'var(--color-reach)')
      .attr('stroke-opacity', stale ? 0.35 : 1)
      .attr('stroke-width', 1.5);

    envelope
      .attr('d', profile?.envelope ? polygonsPath(profile.envelope, x, y) : '')
      .attr('fill', 'none')
      .attr('stroke', 'var(--color-ink)')
      .attr('stroke-opacity', stale ? 0.35 : 0.9)
      .attr('stroke-width', 1.5)
      .attr('stroke-dasharray', '7 3');

    // Legend: which outline is which, top right.
    gLegend.selectAll('*').remove();
    if (profile) {
      const items: Array<{ label: string; dash: string | null; colour: string }> = [{ label: 'Tool-point reach', dash: null, colour: 'var(--color-reach)' }];
      if (profile.envelope?.length) items.push({ label: 'Whole-arm envelope', dash: '7 3', colour: 'var(--color-ink)' });
      items.forEach((it, i) => {
        const gy = MARGIN.top + 40 + i * 16;
        const gx = MARGIN.left + innerW - 150;
        const g = gLegend.append('g').attr('class', `legend-item legend-${i === 0 ? 'tool' : 'envelope'}`);
        g.append('line').attr('x1', gx).attr('x2', gx + 22).attr('y1', gy).attr('y2', gy).attr('stroke', it.colour).attr('stroke-width', 2).attr('stroke-dasharray', it.dash);
        g.append('text').attr('x', gx + 28).attr('y', gy + 4).attr('font-size', 11).attr('fill', 'var(--color-ink)').text(it.label);
      });
    }

    gMarks.selectAll('*').remove();
    if (profile && profile.polygons.length) {
      let rMinSeen = Infinity, rMaxSeen = -Infinity;
      for (const poly of profile.polygons) for (const [r] of poly[0] ?? []) {
        rMinSeen = Math.min(rMinSeen, r);
        rMaxSeen = Math.max(rMaxSeen, r);
      }
      const marks: Array<{ r: number; label: string; cls: string }> = [];
      // The largest |r| is reached in front or behind; mark it where it is.
      const front = rMaxSeen >= -rMinSeen;
      marks.push({ r: front ? profile.maxReach : -profile.maxReach, label: `tool-point reach ${formatMm(profile.maxReach)}`, cls: 'max' });
      if (profile.minReach > 0) marks.push({ r: rMaxSeen > 0 ? profile.minReach : -profile.minReach, label: `min reach ${formatMm(profile.minReach)}`, cls: 'min' });
      for (const m of marks) {
        const g = gMarks.append('g').attr('class', `reach-mark ${m.cls}`);
        g.append('line')
          .attr('x1', x(m.r))
          .attr('x2', x(m.r))
          .attr('y1', MARGIN.top)
          .attr('y2', MARGIN.top + innerH)
          .attr('stroke', 'var(--color-reach)')
          .attr('stroke-dasharray', '5 4');
        g.append('text')
          .attr('x', x(m.r) + (m.r >= 0 ? -4 : 4))
          .attr('y', m.cls === 'max' ? MARGIN.top + 12 : MARGIN.top + 26)
          .attr('text-anchor', m.r >= 0 ? 'end' : 'start')
          .attr('font-size', 11)
          .attr('font-weight', 700)
          .attr('fill', 'var(--color-reach)')
          .text(m.label);
      }
    }
    caption.text(
      profile
        ? `${stale ? 'Last valid profile — ' : ''}boundary ${formatTolerance(profile.toleranceMm)} (${profile.method === 'exact' ? 'traced' : 'sampled'}); grid ${formatMm(step)}`
        : 'No profile yet',
    );

    gPose.selectAll('*').remove();
    if (pose && pose.points.length > 1) {
      const colour = pose.ok ? 'var(--color-ink)' : 'var(--color-ink-faint)';
      gPose.attr('class', pose.ok ? 'pose' : 'pose pose-greyed').attr('opacity', pose.ok ? 1 : 0.6);
      gPose
        .append('path')
        .attr('d', d3.line()(pose.points.map(([r, z]) => [x(r), y(z)])))
        .attr('fill', 'none')
        .attr('stroke', colour)
        .attr('stroke-width', 4)
        .attr('stroke-linecap', 'round')
        .attr('stroke-linejoin', 'round')
        .attr('stroke-dasharray', pose.ok ? null : '6 4');
      gPose
        .selectAll('circle.joint')
        .data(pose.points.slice(0, -1))
        .join('circle')
        .attr('class', 'joint')
        .attr('cx', (d) => x(d[0]))
        .attr('cy', (d) => y(d[1]))
        .attr('r', 4.5)
        .attr('fill', 'var(--color-paper-raised)')
        .attr('stroke', colour)
        .attr('stroke-width', 2);
      const tool = pose.points[pose.points.length - 1];
      gPose
        .append('path')
        .attr('class', 'tool')
        .attr('d', d3.symbol(d3.symbolCross, 80)())
        .attr('transform', `translate(${x(tool[0])},${y(tool[1])}) rotate(45)`)
        .attr('fill', pose.ok ? 'var(--color-accent)' : 'var(--color-ink-faint)');
    }
  }

  return {
    update(profile, pose, opts) {
      last = { profile, pose, stale: opts?.stale ?? false };
      draw();
    },
    resize(w, h) {
      if (w <= 0 || h <= 0) return;
      width = w;
      height = h;
      draw();
    },
    destroy() {
      root.selectAll('*').remove();
    },
  };
}
