/**
 * Drawing of the layout editor's overlays on the plan canvas: reach regions, shared zones, boundaries,
 * work points (plan space, mm, y north) and the marks that keep their size on screen (arm bases,
 * labels, handles; screen px). d3 joins only; no state and no event handling here.
 */
import type { Selection } from 'd3';
import { isReached } from '@shared/analysis';
import type { AreaGeometry } from '@shared/geometry';
import type { ArmPlacement, LayoutContent, Boundary } from '@shared/schemas/layout';
import { BOUNDARY_STYLES, type MarkKind, type ScreenLook } from '@shared/style/boundaryStyles';
import { geometryPath, setPathGeometry } from '../../plan/pathData';
import type { PlanCanvas, PlanViewState } from '../../plan/planTypes';
import type { AnalysisView } from '../../workers/analysisProtocol';

type G = Selection<SVGGElement, unknown, null, undefined>;
type XY = [number, number];

/** Colours of the editor's own marks (selection, finding, paper); boundary kinds are styled by BOUNDARY_STYLES. */
export const SCENE_COLOURS = {
  selected: 'var(--color-accent)',
  finding: 'var(--color-finding-warning)',
  paper: 'var(--color-paper-raised, #fff)',
  /** The section line and its end marks. */
  section: 'var(--color-ink, #1c2230)',
} as const;

/** How a kind of mark is drawn on screen. */
export const screenLook = (kind: MarkKind): ScreenLook => BOUNDARY_STYLES[kind].screen;

/** Id of the shared-zone hatch pattern (one per page). */
export const HATCH_ID = 'rf-shared-hatch';
export const KEEPOUT_HATCH_ID = 'rf-keepout-hatch';
/** Screen length of an arm's J1-zero tick, px (the turn handle sits at its end). */
export const TICK_PX = 34;

/** The hatch patterns, sized in plan mm so their lines are ~7 px apart at the current zoom. */
export function drawPatterns(layer: G, view: PlanViewState): void {
  const k = view.transform.k || 1;
  const defs = layer.selectAll<SVGDefsElement, null>('defs').data([null]).join('defs');
  const { shared, keepout } = BOUNDARY_STYLES;
  const spec = [
    { id: HATCH_ID, px: shared.screen.hatch.spacingPx, colour: shared.screen.colour, width: shared.screen.hatch.width },
    { id: KEEPOUT_HATCH_ID, px: keepout.screen.hatch.spacingPx, colour: keepout.screen.colour, width: keepout.screen.hatch.width },
  ];
  const pats = defs
    .selectAll<SVGPatternElement, (typeof spec)[number]>('pattern')
    .data(spec, (d) => d.id)
    .join((enter) => {
      const p = enter.append('pattern').attr('id', (d) => d.id).attr('patternUnits', 'userSpaceOnUse');
      p.append('path');
      return p;
    });
  pats
    .attr('width', (d) => d.px / k)
    .attr('height', (d) => d.px / k)
    .attr('patternTransform', 'rotate(45)')
    .select('path')
    .attr('d', (d) => `M0,0V${d.px / k}`)
    .style('stroke', (d) => d.colour)
    .attr('stroke-width', (d) => d.width / k);
}

function boundaryPath(z: Boundary): string {
  if (z.points.length === 0) return '';
  const d = z.points.map((p, i) => `${i ? 'L' : 'M'}${p[0]},${p[1]}`).join('');
  return z.kind === 'keepout' || z.kind === 'operator' ? `${d}Z` : d;
}

/** Keep-out and operator areas (plan space), below the reach. */
export function drawAreaBoundaries(layer: G, boundaries: readonly Boundary[], selectedBoundary: string | null): void {
  const areas = boundaries.filter((z) => z.kind === 'keepout' || z.kind === 'operator');
  layer
    .selectAll<SVGPathElement, Boundary>('path.boundary-area')
    .data(areas, (z) => z.id)
    .join('path')
    .attr('class', 'boundary-area')
    .attr('data-boundary', (z) => z.id)
    .attr('data-kind', (z) => z.kind)
    .attr('d', boundaryPath)
    .attr('vector-effect', 'non-scaling-stroke')
    .style('fill', (z) => screenLook(z.kind).fill ?? `url(#${KEEPOUT_HATCH_ID})`)
    .style('fill-opacity', (z) => screenLook(z.kind).fillOpacity ?? 1)
    .style('stroke', (z) => (z.id === selectedBoundary ? SCENE_COLOURS.selected : screenLook(z.kind).colour))
    .style('stroke-width', (z) => {
      const look = screenLook(z.kind);
      return z.id === selectedBoundary ? (look.widthEmphasis ?? look.width) : look.width;
    })
    .style('stroke-dasharray', (z) => screenLook(z.kind).dash ?? null)
    .style('cursor', 'pointer');
}

export interface ArmRegionsDatum {
  arm: ArmPlacement;
  /** Pose the shown pose differs from the analysed one by: a transform in plan mm. */
  transform: string;
  max: AreaGeometry | null;
  restricted: AreaGeometry | null;
  band: AreaGeometry | null;
  emphasis: boolean;
  /** Not drawn here: the arm is being dragged and its reach is on the drag layer (dragLayer.ts). */
  hidden: boolean;
}

/**
 * Each arm's maximum space (dashed outline), restricted space (light fill) and the reach band at
 * the chosen work height (strong outline), plan space. The group's transform follows a drag until
 * the worker's next result arrives.
 */
export function drawReach(layer: G, data: readonly ArmRegionsDatum[]): void {
  const groups = layer
    .selectAll<SVGGElement, ArmRegionsDatum>('g.arm-reach')
    .data(data, (d) => d.arm.id)
    .join((enter) => {
      const g = enter.append('g').attr('class', 'arm-reach').attr('pointer-events', 'none');
      g.append('path').attr('class', 'reach-restricted').attr('fill-rule', 'evenodd').attr('vector-effect', 'non-scaling-stroke');
      g.append('path').attr('class', 'reach-max').attr('fill', 'none').attr('vector-effect', 'non-scaling-stroke');
      g.append('path').attr('class', 'reach-band').attr('fill', 'none').attr('vector-effect', 'non-scaling-stroke');
      return g;
    })
    .attr('data-arm', (d) => d.arm.id)
    .attr('transform', (d) => d.transform)
    .style('display', (d) => (d.hidden ? 'none' : null));
  const { restricted, maxSpace, band } = BOUNDARY_STYLES;
  groups
    .select<SVGPathElement>('path.reach-restricted')
    .each(function (d) {
      setPathGeometry(this, d.restricted);
    })
    .style('fill', restricted.screen.fill)
    .style('fill-opacity', (d) => (d.emphasis ? restricted.screen.fillOpacityEmphasis : restricted.screen.fillOpacity))
    .style('stroke', restricted.screen.colour)
    .style('stroke-opacity', restricted.screen.strokeOpacity)
    .style('stroke-width', restricted.screen.width);
  groups
    .select<SVGPathElement>('path.reach-max')
    .each(function (d) {
      setPathGeometry(this, d.max);
    })
    .style('stroke', maxSpace.screen.colour)
    .style('stroke-opacity', maxSpace.screen.strokeOpacity)
    .style('stroke-width', maxSpace.screen.width)
    .style('stroke-dasharray', maxSpace.screen.dash);
  groups
    .select<SVGPathElement>('path.reach-band')
    .each(function (d) {
      setPathGeometry(this, d.band);
    })
    .style('stroke', band.screen.colour)
    .style('stroke-width', (d) => (d.emphasis ? band.screen.widthEmphasis : band.screen.width))
    .style('stroke-dasharray', band.screen.dash);
}

/** Shared zones: hatched (the pattern) with an outline, plan space. */
export function drawSharedZones(layer: G, sharedZones: AnalysisView['analysis']['sharedZones'], selectedPair: string | null): void {
  layer
    .selectAll<SVGPathElement, (typeof sharedZones)[number]>('path.shared-zone')
    .data(sharedZones, (o) => o.arms.join('+'))
    .join('path')
    .attr('class', 'shared-zone')
    .attr('data-shared', (o) => o.arms.join('+'))
    // the path's data is rebuilt only when its geometry object changed (most results change few zones)
    .each(function (o) {
      setPathGeometry(this, o.geometry);
    })
    .attr('fill-rule', 'evenodd')
    .attr('vector-effect', 'non-scaling-stroke')
    .attr('pointer-events', 'none')
    .style('fill', `url(#${HATCH_ID})`)
    .style('stroke', BOUNDARY_STYLES.shared.screen.colour)
    .style('stroke-width', (o) => (o.arms.join('+') === selectedPair ? BOUNDARY_STYLES.shared.screen.widthEmphasis : BOUNDARY_STYLES.shared.screen.width));
}

/** Fences (thick lines) and openings (a paper-coloured gap drawn over the fence), plan space. */
export function drawLineBoundaries(layer: G, boundaries: readonly Boundary[], selectedBoundary: string | null): void {
  const lines = boundaries.filter((z) => z.kind === 'fence' || z.kind === 'opening');
  // Openings after fences so the gap covers the fence line.
  lines.sort((a, b) => (a.kind === b.kind ? 0 : a.kind === 'fence' ? -1 : 1));
  const { fence, opening } = BOUNDARY_STYLES;
  layer
    .selectAll<SVGPathElement, Boundary>('path.boundary-line')
    .data(lines, (z) => z.id)
    .join('path')
    .attr('class', 'boundary-line')
    .attr('data-boundary', (z) => z.id)
    .attr('data-kind', (z) => z.kind)
    .attr('d', boundaryPath)
    .attr('fill', 'none')
    .attr('vector-effect', 'non-scaling-stroke')
    .attr('stroke-linecap', (z) => (z.kind === 'opening' ? 'butt' : 'square'))
    .attr('stroke-linejoin', 'miter')
    .style('stroke', (z) => (z.kind === 'opening' ? opening.screen.gap.colour : z.id === selectedBoundary ? SCENE_COLOURS.selected : fence.screen.colour))
    .style('stroke-width', (z) => (z.kind === 'opening' ? opening.screen.gap.width : fence.screen.width))
    .style('cursor', 'pointer');
}

/** Name of the canvas layer the work points are painted on. */
export const POINTS_LAYER = 'layout-points';
/** Half the size of a work point's cross, screen px. */
const CROSS_PX = 5;

/** What each canvas's work points were last painted from. */
const drawnPoints = new WeakMap<
  PlanCanvas,
  { points: LayoutContent['workPoints']; k: number; x: number; y: number; width: number; height: number; ratio: number; selected: string | null; reached: Uint8Array }
>();

/** A CSS colour (a theme token too) as the canvas reads it: the element's computed `color`. */
function resolvedColour(el: HTMLElement, css: string): string {
  el.style.color = css;
  return getComputedStyle(el).color;
}

/**
 * Work points as small crosses (~5 px arms) on the plan's canvas layer; red where no arm reaches
 * them. A bitmap, not svg paths, so a frame that changes the svg (a dragged arm's reach) does not
 * paint tens of thousands of crosses again. The canvas carries what it shows: `data-reached`,
 * `data-unreached` and `data-selected` count the work points of each kind (in view or not).
 */
export function drawWorkPoints(canvas: PlanCanvas, content: LayoutContent, coverage: Record<string, Record<string, number>> | null, view: PlanViewState, selectedPoint: string | null): void {
  const { k, x, y } = view.transform;
  const ratio = window.devicePixelRatio || 1;
  // Painted again only when the points, the view, the selection or which points are reached
  // changed (a drag result usually changes none of them).
  const reachedNow = new Uint8Array(content.workPoints.length);
  const anyArm = content.arms.length > 0;
  for (let i = 0; i < content.workPoints.length; i++) {
    const row = coverage?.[content.workPoints[i].id];
    let reached = !row || !anyArm;
    // a loop over the row's entries, not Object.values: no array per point on every result
    if (row && !reached) {
      for (const id in row) {
        if (isReached(row[id])) {
          reached = true;
          break;
        }
      }
    }
    reachedNow[i] = reached ? 1 : 0;
  }
  const last = drawnPoints.get(canvas);
  if (
    last &&
    last.points === content.workPoints &&
    last.k === k &&
    last.x === x &&
    last.y === y &&
    last.width === view.width &&
    last.height === view.height &&
    last.ratio === ratio &&
    last.selected === selectedPoint &&
    last.reached.length === reachedNow.length &&
    last.reached.every((v, i) => v === reachedNow[i])
  )
    return;
  drawnPoints.set(canvas, { points: content.workPoints, k, x, y, width: view.width, height: view.height, ratio, selected: selectedPoint, reached: reachedNow });
  const counts = { reached: 0, unreached: 0, selected: 0 };
  const el = canvas.paintLayer(POINTS_LAYER, (ctx, v) => {
    const s = CROSS_PX;
    // Crosses wholly off the canvas are left out (the widest stroke is 2.5 px).
    const pad = s + 2;
    const kinds = [
      { key: 'reached', path: new Path2D(), colour: BOUNDARY_STYLES.pointReached.screen.colour, w: BOUNDARY_STYLES.pointReached.screen.width },
      { key: 'unreached', path: new Path2D(), colour: BOUNDARY_STYLES.pointUnreached.screen.colour, w: BOUNDARY_STYLES.pointUnreached.screen.width },
      { key: 'selected', path: new Path2D(), colour: SCENE_COLOURS.selected, w: 2.5 },
    ] as const;
    for (let i = 0; i < content.workPoints.length; i++) {
      const p = content.workPoints[i];
      const kind = p.id === selectedPoint ? 2 : reachedNow[i] === 1 ? 0 : 1;
      counts[kinds[kind].key]++;
      // Plan mm to screen px: the view's zoom and pan, y north up.
      const sx = x + k * p.x;
      const sy = y - k * p.y;
      if (sx < -pad || sy < -pad || sx > v.width + pad || sy > v.height + pad) continue;
      const path = kinds[kind].path;
      path.moveTo(sx - s, sy - s);
      path.lineTo(sx + s, sy + s);
      path.moveTo(sx - s, sy + s);
      path.lineTo(sx + s, sy - s);
    }
    const host = ctx.canvas as HTMLCanvasElement;
    for (const kind of kinds) {
      ctx.strokeStyle = resolvedColour(host, kind.colour);
      ctx.lineWidth = kind.w;
      ctx.stroke(kind.path);
    }
  });
  el.dataset.reached = String(counts.reached);
  el.dataset.unreached = String(counts.unreached);
  el.dataset.selected = String(counts.selected);
}

/** The selected finding's own geometry, outlined (plan space). */
export function drawFindingGeometry(layer: G, geometry: AreaGeometry | null): void {
  layer
    .selectAll<SVGPathElement, AreaGeometry>('path.finding-geometry')
    .data(geometry ? [geometry] : [])
    .join('path')
    .attr('class', 'finding-geometry')
    .attr('d', (g) => geometryPath(g))
    .attr('fill', 'none')
    .attr('vector-effect', 'non-scaling-stroke')
    .attr('pointer-events', 'none')
    .style('stroke', SCENE_COLOURS.finding)
    .style('stroke-width', 3)
    .style('stroke-dasharray', '2 3');
}

/** Where on screen a boundary's label goes: the middle of its longest segment (lines) or its vertex centre (areas). */
export function boundaryLabelAt(z: Boundary): XY {
  const pts = z.points as XY[];
  if (z.kind === 'fence' || z.kind === 'opening') {
    let best = 0;
    let at: XY = pts[0];
    for (let i = 0; i + 1 < pts.length; i++) {
      const len = Math.hypot(pts[i + 1][0] - pts[i][0], pts[i + 1][1] - pts[i][1]);
      if (len > best) {
        best = len;
        at = [(pts[i][0] + pts[i + 1][0]) / 2, (pts[i][1] + pts[i + 1][1]) / 2];
      }
    }
    return at;
  }
  const sx = pts.reduce((s, p) => s + p[0], 0);
  const sy = pts.reduce((s, p) => s + p[1], 0);
  return [sx / pts.length, sy / pts.length];
}

/** Text of a boundary's label on the plan. */
export function boundaryLabelText(z: Boundary): string {
  const name = z.label ? `${z.id} ${z.label}` : z.id;
  switch (z.kind) {
    case 'fence':
      return `${name} · fence ${Math.round(z.height ?? 0)} mm`;
    case 'opening':
      return `${name} · access opening`;
    case 'operator':
      return `${name} · OPERATOR AREA — people work here`;
    case 'keepout':
      return `${name} · keep-out`;
  }
}

/** Boundary labels and opening end marks (screen space). */
export function drawBoundaryMarks(layer: G, boundaries: readonly Boundary[], view: PlanViewState): void {
  const labels = layer
    .selectAll<SVGTextElement, Boundary>('text.boundary-label')
    .data(boundaries.filter((z) => z.points.length >= 2), (z) => z.id)
    .join('text')
    .attr('class', 'boundary-label')
    .attr('data-boundary', (z) => z.id)
    .attr('pointer-events', 'none')
    .attr('text-anchor', 'middle')
    .attr('paint-order', 'stroke')
    .style('stroke', SCENE_COLOURS.paper)
    .style('stroke-width', 3)
    .style('font', (z) => `${screenLook(z.kind).label?.weight ?? 400} 11px var(--font-sans, sans-serif)`)
    .style('fill', (z) => screenLook(z.kind).label?.colour ?? screenLook(z.kind).colour)
    .text(boundaryLabelText);
  labels.each(function (z) {
    const [sx, sy] = view.toScreen({ x: boundaryLabelAt(z)[0], y: boundaryLabelAt(z)[1] });
    this.setAttribute('x', String(sx));
    this.setAttribute('y', String(z.kind === 'fence' ? sy - 8 : z.kind === 'opening' ? sy + 16 : sy));
  });
  // Openings: a short bar across the fence at each end, so the gap reads as a door.
  const ends: Array<{ key: string; a: XY; b: XY }> = [];
  for (const z of boundaries) {
    if (z.kind !== 'opening' || z.points.length !== 2) continue;
    const [p, q] = z.points.map(([x, y]) => view.toScreen({ x, y }));
    const len = Math.hypot(q[0] - p[0], q[1] - p[1]) || 1;
    const nx = (-(q[1] - p[1]) / len) * 8;
    const ny = ((q[0] - p[0]) / len) * 8;
    for (const [i, e] of [p, q].entries()) ends.push({ key: `${z.id}:${i}`, a: [e[0] - nx, e[1] - ny], b: [e[0] + nx, e[1] + ny] });
  }
  layer
    .selectAll<SVGLineElement, (typeof ends)[number]>('line.opening-end')
    .data(ends, (d) => d.key)
    .join('line')
    .attr('class', 'opening-end')
    .attr('pointer-events', 'none')
    .attr('x1', (d) => d.a[0])
    .attr('y1', (d) => d.a[1])
    .attr('x2', (d) => d.b[0])
    .attr('y2', (d) => d.b[1])
    .style('stroke', BOUNDARY_STYLES.opening.screen.colour)
    .style('stroke-width', BOUNDARY_STYLES.opening.screen.width);
}

/** Work point ids beside their crosses (screen space), only while few enough to read. */
export function drawPointLabels(layer: G, content: LayoutContent, view: PlanViewState, limit = 150): void {
  const pts = content.workPoints.length <= limit ? content.workPoints : [];
  layer
    .selectAll<SVGTextElement, (typeof pts)[number]>('text.point-label')
    .data(pts, (p) => p.id)
    .join('text')
    .attr('class', 'point-label')
    .attr('pointer-events', 'none')
    .attr('x', (p) => view.toScreen({ x: p.x, y: p.y })[0] + 7)
    .attr('y', (p) => view.toScreen({ x: p.x, y: p.y })[1] - 5)
    .style('font', '10px var(--font-mono, monospace)')
    .style('fill', 'var(--color-ink-muted)')
    .text((p) => p.id);
}
