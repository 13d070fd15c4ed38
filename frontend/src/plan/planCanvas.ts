/**
 * The plan canvas: an imperative d3 module that owns one <svg> and draws a floor plan in the
 * plan frame (millimetres, x east, y north). React drives it through one ref (see PlanView.tsx);
 * it fetches nothing and keeps no React state.
 *
 * ```ts
 * const canvas = createPlanCanvas(svg, { onCursor: (p) => …, grid: true });
 * canvas.setStaticLayers(features, styles);   // drawn once; zoom only moves the group
 * canvas.setLayerStyles(styles);              // restyle / show / hide without redrawing
 * canvas.setBounds(bounds); canvas.fit();     // fit the plan (also key 0)
 * const g = canvas.setOverlay('arms', (layer, view) => { … d3 join into layer … }, { order: 10 });
 * const stop = canvas.onView((view) => …);    // every zoom/pan/resize
 * canvas.destroy();                            // in the effect's cleanup
 * ```
 *
 * Structure of the svg (bottom to top):
 * - `g.plan-grid`    screen space, a pattern whose spacing follows the zoom (optional).
 * - `g.plan-viewport` carries the d3-zoom transform; inside it `g.plan-frame` mirrors y
 *   (`scale(1,-1)`), so everything below it is drawn in plan mm with y north:
 *   - `g.plan-static`     one group per layer (`data-layer`), one path per layer: drawn once.
 *   - plan overlays       `setOverlay(name, render)` groups, ordered by `order`.
 * - canvas layers          `paintLayer(name, paint)`: a <canvas> the size of the svg (in a
 *   `foreignObject`, pointer-events none), for marks too many for svg elements (work points):
 *   an svg change (a dragged arm's reach) then no longer re-rasterises them.
 * - screen overlays        `setOverlay(name, render, {space: 'screen'})`, px, not transformed.
 * - `g.plan-scale-bar`     bottom left, metres, 1-2-5 steps.
 *
 * Rules for overlay authors:
 * - Plan overlays are in mm with y north. Text drawn there reads mirrored: wrap it in
 *   `transform="translate(x,y) scale(1,-1)"` (see `uprightAt`).
 * - Hairlines: give strokes `vector-effect: non-scaling-stroke` so they stay px-thin at any zoom.
 * - Elements that start their own drag (arm handles …) carry the attribute `data-plan-drag`;
 *   the canvas's pan ignores pointer-downs that start on them. Drag handlers keep positions in
 *   refs and commit once on drag end (no React state per pointer move).
 * - Use `view.toPlan(clientX, clientY)` to turn a pointer event into plan mm.
 *
 * Keyboard (the svg is focusable): + / = zoom in, − zoom out, 0 fit, arrow keys pan.
 */
import { select, zoom, zoomIdentity, type D3ZoomEvent, type ZoomBehavior } from 'd3';
import { geometryPath } from './pathData';
import { niceStepAtLeast, scaleBarFor } from './scaleBar';
import {
  fitTransform,
  isValidBounds,
  planToScreen,
  screenToPlan,
  type PlanBounds,
  type PlanPoint,
  type ViewTransform,
} from './viewTransform';

import type { CanvasPaint, LayerStyle, LayerStyles, OverlayOptions, OverlayRender, PlanCanvas, PlanCanvasOptions, PlanFeature, PlanViewState } from './planTypes';

export type { PlanBounds, PlanPoint, ViewTransform } from './viewTransform';
export type * from './planTypes';

const SVG_NS = 'http://www.w3.org/2000/svg';
const HTML_NS = 'http://www.w3.org/1999/xhtml';
const DEFAULT_STYLE: LayerStyle = { stroke: 'var(--color-ink)', strokeWidth: 1 };
const KEY_ZOOM = 1.5;
const KEY_PAN_PX = 60;
const GRID_MIN_PX = 24;
let canvasCount = 0;

/** The transform that draws plan-frame text upright at plan point p (mm). */
export function uprightAt(p: PlanPoint, rotationDeg = 0): string {
  const r = rotationDeg ? ` rotate(${-rotationDeg})` : '';
  return `translate(${p.x},${p.y}) scale(1,-1)${r}`;
}

function styleOf(styles: LayerStyles, layer: string): LayerStyle {
  return styles[layer] ?? styles['*'] ?? DEFAULT_STYLE;
}

/** Creates the plan canvas inside `svg` (which must be in the document). */
export function createPlanCanvas(svg: SVGSVGElement, options: PlanCanvasOptions = {}): PlanCanvas {
  if (!(svg instanceof SVGSVGElement)) throw new TypeError('svg: needs an <svg> element');
  const id = `plan-${++canvasCount}`;
  const padding = options.padding ?? 24;
  const [zoomOut, zoomIn] = options.zoomRange ?? [1 / 10, 400];
  const duration = options.duration ?? 250;
  const root = select(svg);
  const created: Element[] = [];
  const overlays = new Map<string, { g: SVGGElement; order: number; space: 'plan' | 'screen' }>();
  const listeners = new Set<(v: PlanViewState) => void>();
  const canvasLayers = new Map<string, { fo: SVGForeignObjectElement; canvas: HTMLCanvasElement }>();

  let width = svg.clientWidth || 0;
  let height = svg.clientHeight || 0;
  let bounds: PlanBounds | null = null;
  let userMoved = false;
  let gridOn = options.grid ?? false;
  let styles: LayerStyles = {};
  let current: ViewTransform = { k: 1, x: 0, y: 0 };
  let gridStep = 0;

  svg.setAttribute('tabindex', svg.getAttribute('tabindex') ?? '0');
  svg.style.touchAction = 'none';

  const defs = root.append('defs');
  const pattern = defs
    .append('pattern')
    .attr('id', `${id}-grid`)
    .attr('patternUnits', 'userSpaceOnUse')
    .attr('width', 100)
    .attr('height', 100);
  const patternPath = pattern
    .append('path')
    .attr('fill', 'none')
    .style('stroke', 'var(--color-plan-grid, #e4e1d8)')
    .attr('stroke-width', 1);
  const gridG = root.append('g').attr('class', 'plan-grid').attr('pointer-events', 'none');
  gridG.append('rect').attr('width', '100%').attr('height', '100%').attr('fill', `url(#${id}-grid)`);
  const viewport = root.append('g').attr('class', 'plan-viewport');
  const frame = viewport.append('g').attr('class', 'plan-frame').attr('transform', 'scale(1,-1)');
  const staticG = frame.append('g').attr('class', 'plan-static');
  const screenG = root.append('g').attr('class', 'plan-screen');
  const scaleG = root.append('g').attr('class', 'plan-scale-bar').attr('pointer-events', 'none');
  scaleG
    .append('rect')
    .attr('class', 'plan-scale-bar-back')
    .attr('x', -6)
    .attr('y', -18)
    .attr('height', 28)
    .attr('rx', 2)
    .style('fill', 'var(--color-paper-raised, #fff)')
    .style('fill-opacity', 0.85);
  const scaleLine = scaleG
    .append('path')
    .attr('class', 'plan-scale-bar-line')
    .attr('fill', 'none')
    .style('stroke', 'var(--color-ink, #1c2230)')
    .attr('stroke-width', 1.5);
  const scaleText = scaleG
    .append('text')
    .attr('class', 'plan-scale-bar-label')
    .attr('y', -6)
    .style('font', '11px var(--font-sans, sans-serif)')
    .style('fill', 'var(--color-ink, #1c2230)');
  created.push(defs.node()!, gridG.node()!, viewport.node()!, screenG.node()!, scaleG.node()!);

  // The canvas' place on the screen, read once per gesture: reading it on every pointer move after
  // the plan was redrawn forces the browser to lay the whole drawing out again at once. It is read
  // afresh after the pointer enters or presses, the page scrolls or the window or canvas resizes.
  let rect: DOMRect | null = null;
  const svgRect = () => (rect ??= svg.getBoundingClientRect());
  const forgetRect = () => {
    rect = null;
  };

  const viewState = (): PlanViewState => ({
    transform: { ...current },
    width,
    height,
    toPlan: (clientX, clientY) => {
      const r = svgRect();
      return screenToPlan(current, clientX - r.left, clientY - r.top);
    },
    toScreen: (p) => planToScreen(current, p),
  });

  function drawGrid(): void {
    gridG.attr('display', gridOn ? null : 'none');
    if (!gridOn) return;
    const step = niceStepAtLeast(current.k, GRID_MIN_PX);
    const s = step * current.k;
    if (step !== gridStep || Math.abs(Number(pattern.attr('width')) - s) > 1e-6) {
      gridStep = step;
      pattern.attr('width', s).attr('height', s);
      patternPath.attr('d', `M${s},0H0V${s}`);
    }
    // Lines sit at plan x = n·step, i.e. screen x = tx + n·s; likewise for y.
    pattern.attr('x', current.x).attr('y', current.y);
  }

  function drawScaleBar(): void {
    const bar = scaleBarFor(current.k, Math.max(40, Math.min(160, width / 4)));
    scaleG.attr('transform', `translate(16,${Math.max(28, height - 14)})`);
    scaleLine.attr('d', `M0,-4V0H${bar.px}V-4`);
    scaleText.text(bar.label);
    scaleG.attr('data-metres', bar.mm / 1000);
    const textW = (scaleText.node() as SVGTextElement).getComputedTextLength?.() ?? 30;
    scaleG.select('rect').attr('width', Math.max(bar.px, textW) + 12);
  }

  function applyView(t: ViewTransform): void {
    current = { k: t.k, x: t.x, y: t.y };
    viewport.attr('transform', `translate(${t.x},${t.y}) scale(${t.k})`);
    drawGrid();
    drawScaleBar();
    const v = viewState();
    for (const l of listeners) l(v);
  }

  const behaviour: ZoomBehavior<SVGSVGElement, unknown> = zoom<SVGSVGElement, unknown>()
    .filter((event: Event) => {
      const target = event.target as Element | null;
      if (target?.closest?.('[data-plan-drag]')) return false;
      const e = event as MouseEvent;
      return (!e.ctrlKey || event.type === 'wheel') && !e.button;
    })
    .on('zoom', (event: D3ZoomEvent<SVGSVGElement, unknown>) => {
      if (event.sourceEvent) userMoved = true;
      applyView(event.transform);
    });
  root.call(behaviour);
  root.on('dblclick.zoom', null);

  function updateZoomRange(): void {
    if (!bounds || width <= 0 || height <= 0) return;
    const k = fitTransform(bounds, width, height, padding).k;
    behaviour.scaleExtent([k * zoomOut, k * zoomIn]);
  }

  // Where a running animated zoom is heading, so quick repeated key presses add up.
  let heading: ViewTransform | null = null;

  function setTransform(t: ViewTransform, animate: boolean): void {
    const zt = zoomIdentity.translate(t.x, t.y).scale(t.k);
    heading = null;
    if (animate && duration > 0) root.transition().duration(duration).call(behaviour.transform, zt);
    else root.call(behaviour.transform, zt);
  }

  function fit(b?: PlanBounds, opts: { animate?: boolean } = {}): void {
    const target = b ?? bounds;
    if (!isValidBounds(target) || width <= 0 || height <= 0) return;
    if (!b) userMoved = false;
    setTransform(fitTransform(target, width, height, padding), opts.animate ?? false);
  }

  function zoomBy(factor: number, at?: [number, number]): void {
    if (!(factor > 0) || !Number.isFinite(factor)) throw new RangeError('factor: must be a positive number');
    userMoved = true;
    const [px, py] = at ?? [width / 2, height / 2];
    const base = heading ?? current;
    const [lo, hi] = behaviour.scaleExtent();
    const k = Math.min(hi, Math.max(lo, base.k * factor));
    // Keep the plan point under (px, py) where it is.
    const target = { k, x: px - ((px - base.x) * k) / base.k, y: py - ((py - base.y) * k) / base.k };
    const zt = zoomIdentity.translate(target.x, target.y).scale(target.k);
    if (duration > 0) {
      heading = target;
      root
        .transition()
        .duration(duration)
        .call(behaviour.transform, zt)
        .on('end interrupt', () => {
          if (heading === target) heading = null;
        });
    } else {
      root.call(behaviour.transform, zt);
    }
  }

  function onKey(event: KeyboardEvent): void {
    // A page that used the key already (an editor's capture-phase handler) has the last word.
    if (event.defaultPrevented) return;
    if (event.altKey || event.ctrlKey || event.metaKey) return;
    switch (event.key) {
      case '+':
      case '=':
        zoomBy(KEY_ZOOM);
        break;
      case '-':
      case '_':
      case '−':
        zoomBy(1 / KEY_ZOOM);
        break;
      case '0':
        fit(undefined, { animate: true });
        break;
      case 'ArrowLeft':
      case 'ArrowRight':
      case 'ArrowUp':
      case 'ArrowDown': {
        const dx = event.key === 'ArrowLeft' ? KEY_PAN_PX : event.key === 'ArrowRight' ? -KEY_PAN_PX : 0;
        const dy = event.key === 'ArrowUp' ? KEY_PAN_PX : event.key === 'ArrowDown' ? -KEY_PAN_PX : 0;
        userMoved = true;
        root.call(behaviour.translateBy, dx / current.k, dy / current.k);
        break;
      }
      default:
        return;
    }
    event.preventDefault();
  }

  function onPointerMove(event: PointerEvent): void {
    if (!options.onCursor) return;
    const r = svgRect();
    options.onCursor(screenToPlan(current, event.clientX - r.left, event.clientY - r.top));
  }
  function onPointerLeave(): void {
    options.onCursor?.(null);
  }
  svg.addEventListener('keydown', onKey);
  svg.addEventListener('pointermove', onPointerMove);
  svg.addEventListener('pointerleave', onPointerLeave);
  svg.addEventListener('pointerenter', forgetRect);
  svg.addEventListener('pointerdown', forgetRect, { capture: true });
  window.addEventListener('scroll', forgetRect, { capture: true, passive: true });
  window.addEventListener('resize', forgetRect);

  // A new device pixel ratio (browser zoom, another screen) is a view change: canvas layers repaint sharper.
  let ratioQuery: MediaQueryList | null = null;
  const onRatio = () => {
    watchRatio();
    applyView(current);
  };
  function watchRatio(): void {
    ratioQuery?.removeEventListener('change', onRatio);
    ratioQuery = typeof window.matchMedia === 'function' ? window.matchMedia(`(resolution: ${window.devicePixelRatio || 1}dppx)`) : null;
    ratioQuery?.addEventListener('change', onRatio);
  }
  watchRatio();

  const resize = new ResizeObserver(() => {
    forgetRect();
    const w = svg.clientWidth;
    const h = svg.clientHeight;
    if (w === width && h === height) return;
    width = w;
    height = h;
    updateZoomRange();
    if (!userMoved && bounds) fit();
    else applyView(current);
  });
  resize.observe(svg);

  function applyStyles(): void {
    staticG.selectAll<SVGGElement, unknown>('g.plan-layer').each(function () {
      const s = styleOf(styles, this.getAttribute('data-layer') ?? '');
      const g = select(this);
      g.attr('display', s.visible === false ? 'none' : null).style('opacity', s.opacity ?? 1);
      g.select<SVGPathElement>('path.plan-lines')
        .style('stroke', s.stroke)
        .style('stroke-width', s.strokeWidth ?? 1)
        .style('stroke-dasharray', s.dash ?? 'none')
        .style('fill', s.fill ?? 'none')
        .style('fill-opacity', s.fillOpacity ?? 1);
      g.selectAll<SVGTextElement, unknown>('text').style('fill', s.stroke);
    });
  }

  function setStaticLayers(features: readonly PlanFeature[], nextStyles?: LayerStyles): void {
    if (nextStyles) styles = nextStyles;
    const paths = new Map<string, string[]>();
    const labels = new Map<string, PlanFeature[]>();
    for (const f of features) {
      const layer = f.properties?.layer ?? '0';
      if (!paths.has(layer)) {
        paths.set(layer, []);
        labels.set(layer, []);
      }
      if (f.geometry?.type === 'Point') {
        if (f.properties?.text) labels.get(layer)!.push(f);
      } else {
        const d = geometryPath(f.geometry);
        if (d) paths.get(layer)!.push(d);
      }
    }
    staticG.selectAll('*').remove();
    // Built off-document and attached once, so the browser lays the drawing out a single time.
    const fragment = document.createDocumentFragment();
    for (const [layer, ds] of paths) {
      const g = document.createElementNS(SVG_NS, 'g');
      g.setAttribute('class', 'plan-layer');
      g.setAttribute('data-layer', layer);
      const path = document.createElementNS(SVG_NS, 'path');
      path.setAttribute('class', 'plan-lines');
      path.setAttribute('d', ds.join(''));
      path.setAttribute('fill-rule', 'evenodd');
      path.setAttribute('vector-effect', 'non-scaling-stroke');
      path.setAttribute('stroke-linejoin', 'round');
      path.setAttribute('data-features', String(ds.length));
      g.appendChild(path);
      for (const f of labels.get(layer) ?? []) {
        const [x, y] = (f.geometry as { coordinates: number[] }).coordinates;
        const t = document.createElementNS(SVG_NS, 'text');
        t.setAttribute('transform', uprightAt({ x, y }, f.properties.rotation ?? 0));
        t.setAttribute('font-size', String(f.properties.textHeight && f.properties.textHeight > 0 ? f.properties.textHeight : 250));
        t.setAttribute('class', 'plan-label');
        t.textContent = f.properties.text ?? '';
        g.appendChild(t);
      }
      fragment.appendChild(g);
    }
    staticG.node()!.appendChild(fragment);
    applyStyles();
  }

  function setLayerStyles(next: LayerStyles): void {
    styles = next;
    applyStyles();
  }

  function setBounds(b: PlanBounds | null): void {
    bounds = isValidBounds(b) ? { ...b } : null;
    updateZoomRange();
    // New bounds mean a new or rescaled drawing: show it whole.
    if (bounds) fit();
  }

  function orderOverlays(space: 'plan' | 'screen'): void {
    const parent = space === 'plan' ? frame.node()! : screenG.node()!;
    const list = [...overlays.values()].filter((o) => o.space === space).sort((a, b) => a.order - b.order);
    for (const o of list) parent.appendChild(o.g);
  }

  function setOverlay(name: string, render: OverlayRender, opts: OverlayOptions = {}): SVGGElement {
    if (!name) throw new RangeError('name: an overlay needs a name');
    let entry = overlays.get(name);
    const space = opts.space ?? entry?.space ?? 'plan';
    const order = opts.order ?? entry?.order ?? 0;
    if (!entry || entry.space !== space || entry.order !== order) {
      const g = entry?.g ?? (document.createElementNS(SVG_NS, 'g') as SVGGElement);
      g.setAttribute('class', 'plan-overlay');
      g.setAttribute('data-overlay', name);
      entry = { g, order, space };
      overlays.set(name, entry);
      orderOverlays('plan');
      orderOverlays('screen');
    }
    render(select(entry.g), viewState());
    return entry.g;
  }

  function paintLayer(name: string, paint: CanvasPaint): HTMLCanvasElement {
    if (!name) throw new RangeError('name: a canvas layer needs a name');
    let entry = canvasLayers.get(name);
    if (!entry) {
      const fo = document.createElementNS(SVG_NS, 'foreignObject') as SVGForeignObjectElement;
      fo.setAttribute('class', 'plan-canvas-layer');
      fo.setAttribute('data-canvas-layer', name);
      fo.setAttribute('x', '0');
      fo.setAttribute('y', '0');
      fo.setAttribute('pointer-events', 'none');
      const canvas = document.createElementNS(HTML_NS, 'canvas') as HTMLCanvasElement;
      canvas.style.display = 'block';
      canvas.style.pointerEvents = 'none';
      fo.appendChild(canvas);
      svg.insertBefore(fo, screenG.node());
      entry = { fo, canvas };
      canvasLayers.set(name, entry);
    }
    const { fo, canvas } = entry;
    const ratio = window.devicePixelRatio || 1;
    const w = Math.max(0, width);
    const h = Math.max(0, height);
    if (fo.getAttribute('width') !== String(w) || fo.getAttribute('height') !== String(h)) {
      fo.setAttribute('width', String(w));
      fo.setAttribute('height', String(h));
      canvas.style.width = `${w}px`;
      canvas.style.height = `${h}px`;
    }
    const bw = Math.round(w * ratio);
    const bh = Math.round(h * ratio);
    if (canvas.width !== bw || canvas.height !== bh) {
      canvas.width = bw;
      canvas.height = bh;
    }
    const ctx = canvas.getContext('2d');
    if (ctx) {
      ctx.setTransform(1, 0, 0, 1, 0, 0);
      ctx.clearRect(0, 0, bw, bh);
      ctx.setTransform(bw / (w || 1), 0, 0, bh / (h || 1), 0, 0);
      paint(ctx, viewState());
    }
    return canvas;
  }

  function removeOverlay(name: string): void {
    overlays.get(name)?.g.remove();
    overlays.delete(name);
    canvasLayers.get(name)?.fo.remove();
    canvasLayers.delete(name);
  }

  applyView(current);

  return {
    svg,
    setStaticLayers,
    setLayerStyles,
    setBounds,
    fit,
    zoomBy,
    setGrid(on: boolean) {
      gridOn = on;
      drawGrid();
    },
    setOverlay,
    paintLayer,
    removeOverlay,
    onView(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
    view: viewState,
    destroy() {
      resize.disconnect();
      root.interrupt();
      root.on('.zoom', null);
      svg.removeEventListener('keydown', onKey);
      svg.removeEventListener('pointermove', onPointerMove);
      svg.removeEventListener('pointerleave', onPointerLeave);
      svg.removeEventListener('pointerenter', forgetRect);
      svg.removeEventListener('pointerdown', forgetRect, { capture: true });
      window.removeEventListener('scroll', forgetRect, { capture: true });
      window.removeEventListener('resize', forgetRect);
      ratioQuery?.removeEventListener('change', onRatio);
      listeners.clear();
      for (const o of overlays.values()) o.g.remove();
      overlays.clear();
      for (const c of canvasLayers.values()) c.fo.remove();
      canvasLayers.clear();
      for (const el of created) el.remove();
      // d3-zoom keeps its state on the node; clear it so a new canvas on this svg starts fresh.
      delete (svg as SVGSVGElement & { __zoom?: unknown }).__zoom;
    },
  };
}
