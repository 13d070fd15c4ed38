/**
 * The layout editor's marks that keep their size on screen and take presses: arm bases with their
 * J1-zero tick and turn handle, the selected zone's corner handles, and the shape being drawn
 * (screen px). d3 joins only; the press handlers come from the tool dispatcher.
 */
import { armPose } from '@shared/geometry/frames';
import type { Selection } from 'd3';
import type { ArmPlacement } from '@shared/schemas/layout';
import { ZONE_STYLES } from '@shared/style/zoneStyles';
import type { PlanViewState } from '../../plan/planTypes';
import type { XY } from './sceneTypes';
import { SCENE_COLOURS, TICK_PX } from './sceneDraw';
import type { Draft } from './tools/drawZoneTool';
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
    .attr('transform', (a) => {
      const [x, y] = view.toScreen({ x: a.x, y: a.y });
      return `translate(${x},${y})`;
    })
    .style('cursor', o.readOnly ? 'pointer' : 'grab');
  const base = ZONE_STYLES.armBase.screen;
  const colour = (a: ArmPlacement) => (a.id === selectedArm ? SCENE_COLOURS.selected : base.colour);
  // J1 zero direction on screen (screen y grows downward, plan y upward).
  const tip = (a: ArmPlacement): XY => {
    const pose = armPose(a);
    return [pose.cos * TICK_PX, -pose.sin * TICK_PX];
  };
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

/** Square handles on the corners given (those of the selected zone). */
export function drawVertexHandles(layer: G, corners: readonly VertexAt[], view: PlanViewState, onPress: (e: PointerEvent, el: Element, corner: VertexAt) => void): void {
  layer
    .selectAll<SVGRectElement, VertexAt>('rect.vertex-handle')
    .data(corners, (d) => `${d.zoneId}:${d.index}`)
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
