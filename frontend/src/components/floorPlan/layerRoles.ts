import { LAYER_ROLES, type LayerRole } from '@shared/schemas/floorPlan';
import type { ImportLayer } from '@shared/schemas/floorPlan';
import type { LayerStyle, LayerStyles } from '../../plan/planCanvas';

/** What each layer role is called on screen, and a line saying what it means for the plan. */
export const ROLE_LABEL: Record<LayerRole, { label: string; hint: string }> = {
  outline: { label: 'Floor outline', hint: 'The edge of the usable floor; arms must stand inside it.' },
  wall: { label: 'Wall', hint: 'Building walls; reach into them is reported.' },
  column: { label: 'Column', hint: 'Building columns; reach into them is reported.' },
  obstacle: { label: 'Obstacle', hint: 'Machines, conveyors, racks: solid up to their height.' },
  ignore: { label: 'Not used', hint: 'Drawn faintly for orientation; no checks use it.' },
};

export const ROLE_OPTIONS = LAYER_ROLES.map((role) => ({ role, ...ROLE_LABEL[role] }));

/** Roles whose layers carry a height (mm above the floor; empty = full height). */
export const ROLES_WITH_HEIGHT: ReadonlySet<LayerRole> = new Set<LayerRole>(['wall', 'obstacle']);

/** How a layer of each role is drawn in the preview (colours are theme tokens in styles.css). */
export const ROLE_STYLE: Record<LayerRole, LayerStyle> = {
  outline: { stroke: 'var(--color-plan-outline)', strokeWidth: 2 },
  wall: { stroke: 'var(--color-plan-wall)', strokeWidth: 1.5 },
  column: { stroke: 'var(--color-plan-column)', strokeWidth: 1.25, fill: 'var(--color-plan-column-fill)' },
  obstacle: { stroke: 'var(--color-plan-obstacle)', strokeWidth: 1, fill: 'var(--color-plan-obstacle-fill)', fillOpacity: 0.8 },
  ignore: { stroke: 'var(--color-plan-ignore)', strokeWidth: 0.75, opacity: 0.6 },
};

/** Canvas styles for the layers: the role's style, hidden where `hidden` names the layer. */
export function layerStylesFor(layers: readonly ImportLayer[], hidden: ReadonlySet<string>): LayerStyles {
  const out: Record<string, LayerStyle> = {};
  for (const l of layers) out[l.name] = { ...ROLE_STYLE[l.role], visible: !hidden.has(l.name) };
  return out;
}
