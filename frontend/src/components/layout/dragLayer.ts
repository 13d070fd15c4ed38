/**
 * The reach of an arm being dragged (moved or turned), drawn on a layer of its own above the plan
 * while the drag lasts: a copy of its reach paths in an svg of their own, moved by a CSS transform.
 * A pointer move then changes nothing in the plan's svg, where moving the reach would have the
 * browser paint every mark under it again (floor plan, other arms, work points); the compositor
 * alone moves the copy. The plan's own copy of that reach is hidden meanwhile (layoutScene), and the
 * arm's small mark stays in the plan. Screen px; poses in plan mm and degrees CCW.
 */
import type { PlanViewState } from '../../plan/planTypes';

const SVG_NS = 'http://www.w3.org/2000/svg';

export interface ArmPoseXY {
  x: number;
  y: number;
  yaw: number;
}

export interface DragLayer {
  readonly armId: string;
  /** Shows the copy at `pose` (the drag's current pose). */
  moveTo(pose: ArmPoseXY, view: PlanViewState): void;
  /** Removes the layer. */
  remove(): void;
}

/**
 * A layer with a copy of the reach drawn for `armId` in `svg` (group g.arm-reach[data-arm]), which
 * shows the arm at `drawnAt`; null when there is no such group.
 */
export function createDragLayer(svg: SVGSVGElement, armId: string, drawnAt: ArmPoseXY, view: PlanViewState): DragLayer | null {
  const source = [...svg.querySelectorAll<SVGGElement>('g.arm-reach')].find((g) => g.dataset.arm === armId);
  const parent = svg.parentElement;
  const ctm = source?.getCTM();
  if (!source || !parent || !ctm) return null;
  const layer = document.createElementNS(SVG_NS, 'svg');
  layer.setAttribute('class', 'plan-drag-layer');
  layer.setAttribute('aria-hidden', 'true');
  layer.setAttribute('data-arm', armId);
  // Over the plan's svg, the same size; what the moved copy carries past the plan's edge is cut off
  // by the clip below, not by the layer's own box (which moves with it).
  // (fixed: the page does not scroll under a held pointer, and the layer lasts one drag)
  const box = svg.getBoundingClientRect();
  const clip = document.createElement('div');
  clip.className = 'plan-drag-clip';
  Object.assign(clip.style, {
    position: 'fixed',
    left: `${box.left}px`,
    top: `${box.top}px`,
    width: `${box.width}px`,
    height: `${box.height}px`,
    overflow: 'hidden',
    pointerEvents: 'none',
  });
  Object.assign(layer.style, { position: 'absolute', left: '0', top: '0', width: '100%', height: '100%', overflow: 'visible', willChange: 'transform' });
  const g = document.createElementNS(SVG_NS, 'g');
  g.setAttribute('transform', `matrix(${ctm.a},${ctm.b},${ctm.c},${ctm.d},${ctm.e},${ctm.f})`);
  for (const child of source.children) g.appendChild(child.cloneNode(true));
  layer.appendChild(g);
  clip.appendChild(layer);
  parent.insertBefore(clip, svg.nextSibling);
  const [bx, by] = view.toScreen({ x: drawnAt.x, y: drawnAt.y });
  layer.style.transformOrigin = `${bx}px ${by}px`;
  return {
    armId,
    moveTo(pose, v) {
      const k = v.transform.k;
      // screen y grows downward: a plan move north is a move up, a turn CCW in plan is CCW on screen
      const dx = k * (pose.x - drawnAt.x);
      const dy = -k * (pose.y - drawnAt.y);
      layer.style.transform = `translate(${dx}px, ${dy}px) rotate(${-(pose.yaw - drawnAt.yaw)}deg)`;
    },
    remove() {
      clip.remove();
    },
  };
}
