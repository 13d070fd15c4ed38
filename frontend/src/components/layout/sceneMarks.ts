/**
 * The layout editor's marks that keep their size on screen and take presses: arm bases with their
 * J1-zero tick and turn handle, the selected boundary's corner handles, and the shape being drawn
 * (screen px). d3 joins only; the press handlers come from the tool dispatcher.
 */
import { armPose } from '@shared/geometry';
import type { Selection } from 'd3';
import type { ArmPlacement } from '@shared/schemas/layout';
import { BOUNDARY_STYLES } from '@shared/style/boundaryStyles';
import type { PlanViewState } from '../../plan/planTypes';
import type { XY } from './sceneTypes';
import { SCENE_COLOURS, TICK_PX } from './sceneDraw';
import type { Draft } from './tools/drawBoundaryTool';
import type { VertexAt } from './tools/tool';

type G = Selection<SVGGElement, unknown, null, undefined>;

export interface ArmMarksOptions {
  selectedArm: string | null;
  highlightArms: ReadonlySet<string>;
  readOnly: boolean;
}

/** Arm bases at their (shown) poses; the selected one gets its turn handle at the tick's end. */
export function drawArmMarks(layer: G, arms: readonly ArmPlacement[], view: PlanViewState, o: ArmMarksOptions, onPress: (e: PointerEvent, el: Element, arm: ArmPlacement) => void): void {
  const { selectedArm } = o;
  const marks = layer
    .selectAll<SVGGElement, ArmPlacement>('g.arm-mark')
    .data(arms, (a) => a.id)
    .join((enter) => {
      const g = enter.append('g').attr('class', 'arm-mark').attr('data-plan-drag', '');
      g.append('line').attr('class', 'arm-tick');
      g.append('circle').attr('class', 'arm-base').attr('r', 8);
      g.append('circle').attr('class', 'arm-axis').attr('r', 2).attr('pointer-events', 'none');
      g.append('text').attr('class', 'arm-label').attr('x', 12).attr('y', -10).attr('paint-order', 'stroke');
      g.append('circle').attr('class', 'turn-handle').attr('r', 5.5).attr('data-plan-drag', '');
      return g;
    })
    .attr('data-arm', (a) => a.id)
    .attr('data-selected', (a) => (a.id === selectedArm ? 'true' : null))
    .attr('transform', (a) => markTransform(a, view))
    .style('cursor', o.readOnly ? 'pointer' : 'grab');
  const base = BOUNDARY_STYLES.armBase.screen;
  const colour = (a: ArmPlacement) => (a.id === selectedArm ? SCENE_COLOURS.selected : base.colour);
  marks
    .select('line.arm-tick')
    .attr('x1', 0)
    .attr('y1', 0)
    .attr('x2', (a) => tip(a)[0])
    .attr('y2', (a) => tip(a)[1])
    .style('stroke', colour)
    .style('stroke-width', 2.5);
  marks
    .select('circle.arm-base')
    .style('fill', SCENE_COLOURS.paper)
    .style('stroke', colour)
    .style('stroke-width', (a) => (a.id === selectedArm || o.highlightArms.has(a.id) ? base.widthEmphasis : base.width));
  marks.select('circle.arm-axis').style('fill', colour);
  marks
    .select('text.arm-label')
    .style('font', '700 12px var(--font-sans, sans-serif)')
    .style('fill', colour)
    .style('stroke', SCENE_COLOURS.paper)
    .style('stroke-width', 3)
    .text((a) => (a.label ? `${a.id} ${a.label}` : a.id));
  marks
    .select('circle.turn-handle')
    .attr('display', (a) => (a.id === selectedArm && !o.readOnly ? null : 'none'))
    .attr('cx', (a) => tip(a)[0])
    .attr('cy', (a) => tip(a)[1])
    .attr('aria-label', (a) => `Turn ${a.id}`)
    .style('fill', SCENE_COLOURS.selected)
    .style('stroke', SCENE_COLOURS.paper)
    .style('stroke-width', 1.5)
    .style('cursor', 'alias');
  marks.on('pointerdown', function (e: PointerEvent, a) {
    onPress(e, this, a);
  });
}

/** Where an arm's mark sits on screen. */
const markTransform = (a: ArmPlacement, view: PlanViewState): string => {
  const [x, y] = view.toScreen({ x: a.x, y: a.y });
  return `translate(${x},${y})`;
};

/** J1 zero direction on screen, TICK_PX long (screen y grows downward, plan y upward). */
function tip(a: ArmPlacement): XY {
  const pose = armPose(a);
  return [pose.cos * TICK_PX, -pose.sin * TICK_PX];
}

/**
 * Moves one arm's mark (drawn by drawArmMarks) to the arm's pose: its place, its J1 tick and turn
 * handle, nothing else. What a drag changes on each pointer move.
 */
export function placeArmMark(layer: G, arm: ArmPlacement, view: PlanViewState): void {
  const mark = layer.selectAll<SVGGElement, ArmPlacement>('g.arm-mark').filter((a) => a.id === arm.id);
  const [tx, ty] = tip(arm);
  mark.attr('transform', markTransform(arm, view));
  mark.select('line.arm-tick').attr('x2', tx).attr('y2', ty);
  mark.select('circle.turn-handle').attr('cx', tx).attr('cy', ty);
}

/** Square handles on the corners given (those of the selected boundary). */
export function drawVertexHandles(layer: G, corners: readonly VertexAt[], view: PlanViewState, onPress: (e: PointerEvent, el: Element, corner: VertexAt) => void): void {
  layer
    .selectAll<SVGRectElement, VertexAt>('rect.vertex-handle')
    .data(corners, (d) => `${d.boundaryId}:${d.index}`)
    .join('rect')
    .attr('class', 'vertex-handle')
    .attr('data-plan-drag', '')
    .attr('width', 10)
    .attr('height', 10)
    .attr('x', (d) => view.toScreen({ x: d.at[0], y: d.at[1] })[0] - 5)
    .attr('y', (d) => view.toScreen({ x: d.at[0], y: d.at[1] })[1] - 5)
    .style('fill', SCENE_COLOURS.paper)
    .style('stroke', SCENE_COLOURS.selected)
    .style('stroke-width', 2)
    .style('cursor', 'move')
    .on('pointerdown', function (e: PointerEvent, d) {
      onPress(e, this, d);
    });
}

/** The shape being drawn: its corners and a dashed line on to the pointer. */
export function drawDraft(layer: G, draft: Draft | null, view: PlanViewState): void {
  const placed = draft?.points ?? [];
  const pts = draft?.cursor && placed.length ? [...placed, draft.cursor] : placed;
  const screen = pts.map(([x, y]) => view.toScreen({ x, y }));
  const closed = draft?.closed ?? false;
  const d = screen.length ? screen.map((p, i) => `${i ? 'L' : 'M'}${p[0]},${p[1]}`).join('') + (closed && screen.length > 2 ? 'Z' : '') : '';
  layer
    .selectAll<SVGPathElement, string>('path.draft')
    .data([d])
    .join('path')
    .attr('class', 'draft')
    .attr('d', (x) => x)
    .attr('fill', 'none')
    .attr('pointer-events', 'none')
    .style('stroke', SCENE_COLOURS.selected)
    .style('stroke-width', 2)
    .style('stroke-dasharray', '5 3');
  layer
    .selectAll<SVGCircleElement, [number, number]>('circle.draft-point')
    .data(screen.slice(0, placed.length))
    .join('circle')
    .attr('class', 'draft-point')
    .attr('r', 3.5)
    .attr('cx', (p) => p[0])
    .attr('cy', (p) => p[1])
    .attr('pointer-events', 'none')
    .style('fill', SCENE_COLOURS.selected);
}

/** Screen length of the ticks across the ends of the section line, px. */
const SECTION_TICK_PX = 14;

/**
 * The section line (screen px): dashed, a tick across each end with its letter, A at the start and
 * A′ at the end, and an arrowhead on each tick pointing the way the side view looks (to the line's
 * left, so s grows to the right in the view). A line under way follows the pointer.
 */
export function drawSectionLine(layer: G, line: readonly [XY, XY] | null, draft: { start: XY; cursor: XY | null } | null, view: PlanViewState): void {
  const ends: Array<[XY, XY]> = [];
  if (draft) ends.push([draft.start, draft.cursor ?? draft.start]);
  else if (line) ends.push([line[0], line[1]]);
  const data = ends.map(([a, b]) => {
    const pa = view.toScreen({ x: a[0], y: a[1] });
    const pb = view.toScreen({ x: b[0], y: b[1] });
    const len = Math.hypot(pb[0] - pa[0], pb[1] - pa[1]) || 1;
    // Screen y points down: the plan's left of A→A′ is (dy, −dx) on screen.
    const nx = (pb[1] - pa[1]) / len;
    const ny = -(pb[0] - pa[0]) / len;
    return { pa, pb, nx, ny, drafting: !!draft, short: len < 2 };
  });
  const g = layer
    .selectAll<SVGGElement, (typeof data)[number]>('g.section-line')
    .data(data)
    .join((enter) => {
      const e = enter.append('g').attr('class', 'section-line').attr('pointer-events', 'none');
      e.append('path').attr('class', 'section-run');
      e.append('path').attr('class', 'section-ticks');
      e.append('text').attr('class', 'section-a').attr('data-section-end', 'A');
      e.append('text').attr('class', 'section-b').attr('data-section-end', 'A′');
      return e;
    });
  const ink = SCENE_COLOURS.section;
  g.select('path.section-run')
    .attr('d', (d) => `M${d.pa[0]},${d.pa[1]}L${d.pb[0]},${d.pb[1]}`)
    .style('fill', 'none')
    .style('stroke', ink)
    .style('stroke-width', 1.75)
    .style('stroke-dasharray', '10 4 2 4');
  const tick = (p: XY, nx: number, ny: number) => {
    const h = SECTION_TICK_PX / 2;
    const tip: XY = [p[0] + nx * (h + 6), p[1] + ny * (h + 6)];
    return `M${p[0] - nx * h},${p[1] - ny * h}L${p[0] + nx * h},${p[1] + ny * h}M${tip[0] - ny * 4 - nx * 5},${tip[1] + nx * 4 - ny * 5}L${tip[0]},${tip[1]}L${tip[0] + ny * 4 - nx * 5},${tip[1] - nx * 4 - ny * 5}`;
  };
  g.select('path.section-ticks')
    .attr('d', (d) => (d.short ? tick(d.pa, 0, -1) : tick(d.pa, d.nx, d.ny) + tick(d.pb, d.nx, d.ny)))
    .style('fill', 'none')
    .style('stroke', ink)
    .style('stroke-width', 2.5)
    .style('stroke-linejoin', 'round');
  const label = (sel: Selection<SVGTextElement, (typeof data)[number], SVGGElement, unknown>, which: 'a' | 'b') =>
    sel
      .attr('x', (d) => (which === 'a' ? d.pa : d.pb)[0] - d.nx * 16)
      .attr('y', (d) => (which === 'a' ? d.pa : d.pb)[1] - d.ny * 16 + 4)
      .attr('text-anchor', 'middle')
      .attr('display', (d) => (which === 'b' && d.short ? 'none' : null))
      .attr('paint-order', 'stroke')
      .style('font', '700 13px var(--font-sans, sans-serif)')
      .style('fill', ink)
      .style('stroke', SCENE_COLOURS.paper)
      .style('stroke-width', 3)
      .text(which === 'a' ? 'A' : 'A′');
  label(g.select<SVGTextElement>('text.section-a'), 'a');
  label(g.select<SVGTextElement>('text.section-b'), 'b');
}
