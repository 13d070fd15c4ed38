/**
 * Types of the plan canvas API (planCanvas.ts): layer styles, features, the view state overlays
 * receive, options and the canvas interface. Lengths in plan mm (x east, y north) unless a name
 * says px.
 */
import type { Selection } from 'd3';
import type { Feature, Geometry } from 'geojson';
import type { PlanBounds, PlanPoint, ViewTransform } from './viewTransform';

/** How one static layer is drawn. Colours may be any CSS colour, including `var(--token)`. */
export interface LayerStyle {
  stroke: string;
  /** Stroke width in screen px (the stroke does not scale with zoom). Default 1. */
  strokeWidth?: number;
  /** Fill of closed shapes; none when omitted. */
  fill?: string;
  fillOpacity?: number;
  /** Opacity of the whole layer, 0–1. Default 1. */
  opacity?: number;
  /** Hidden layers are kept drawn but not displayed. Default true. */
  visible?: boolean;
  /** Dash pattern in screen px, e.g. "4 3". */
  dash?: string;
}

/** Style per layer name; layers not named fall back to `'*'`, then to a plain ink line. */
export type LayerStyles = Readonly<Record<string, LayerStyle>>;

/** Properties the canvas reads from a feature: its layer and, for labels, text. */
export interface PlanFeatureLike {
  layer: string;
  text?: string;
  textHeight?: number;
  rotation?: number;
}

export type PlanFeature = Feature<Geometry, PlanFeatureLike>;

/** What overlays and view listeners receive. */
export interface PlanViewState {
  transform: ViewTransform;
  width: number;
  height: number;
  /** Plan mm under a client (page) position. */
  toPlan(clientX: number, clientY: number): PlanPoint;
  /** Screen px (relative to the svg) of a plan point. */
  toScreen(p: PlanPoint): [number, number];
}

export type OverlayRender = (layer: Selection<SVGGElement, unknown, null, undefined>, view: PlanViewState) => void;

/**
 * Paints a canvas layer: `ctx` is cleared and scaled so one unit is one screen px (relative to the
 * svg, as `view.toScreen` gives), whatever the device pixel ratio.
 */
export type CanvasPaint = (ctx: CanvasRenderingContext2D, view: PlanViewState) => void;

export interface OverlayOptions {
  /** Stacking order among overlays of the same space; higher is on top. Default 0. */
  order?: number;
  /** 'plan' (default): mm with y north, moves with zoom. 'screen': px, fixed on screen. */
  space?: 'plan' | 'screen';
}

export interface PlanCanvasOptions {
  /** Called with the plan point under the pointer (mm), or null when the pointer leaves. */
  onCursor?: (p: PlanPoint | null) => void;
  /** Draw a grid behind the plan. Default false. */
  grid?: boolean;
  /** Free space kept around the plan when fitting, px. Default 24. */
  padding?: number;
  /** How far out and in one may zoom, as factors of the fitted scale. Default [1/10, 400]. */
  zoomRange?: [number, number];
  /** Duration of animated fits and key zooms, ms. Default 250; 0 in tests or reduced motion. */
  duration?: number;
}

/** The canvas API. See the top of this file. */
export interface PlanCanvas {
  /** The svg the canvas draws into (for overlays that listen to pointer events on the drawing). */
  readonly svg: SVGSVGElement;
  /** Replaces the static plan drawing: one path per layer, built once, never redrawn on zoom. */
  setStaticLayers(features: readonly PlanFeature[], styles?: LayerStyles): void;
  /** Restyles the static layers (colour, visibility, opacity) without rebuilding their paths. */
  setLayerStyles(styles: LayerStyles): void;
  /** The plan extent (mm) used by fit and the zoom range; fits the view to it. */
  setBounds(bounds: PlanBounds | null): void;
  /** Shows `bounds` (default: the plan extent) whole. */
  fit(bounds?: PlanBounds, opts?: { animate?: boolean }): void;
  /** Zooms by `factor` about the viewport centre (or a screen point). */
  zoomBy(factor: number, at?: [number, number]): void;
  setGrid(on: boolean): void;
  /** Creates (first call) and renders a named overlay group; the group persists between calls. */
  setOverlay(name: string, render: OverlayRender, opts?: OverlayOptions): SVGGElement;
  /**
   * Creates (first call) a named canvas layer — a bitmap the size of the svg at the device pixel
   * ratio, above the plan-space overlays and below the screen overlays, pointer-events none — and
   * paints it now. For marks too many for svg elements: the canvas does not repaint it by itself, so
   * the caller paints again when what it shows or the view (`onView`: zoom, pan, resize, pixel
   * ratio) changed. `removeOverlay(name)` removes it.
   */
  paintLayer(name: string, paint: CanvasPaint): HTMLCanvasElement;
  removeOverlay(name: string): void;
  /** Subscribes to view changes (zoom, pan, resize); returns the unsubscribe function. */
  onView(listener: (view: PlanViewState) => void): () => void;
  view(): PlanViewState;
  /** Removes listeners, observers and every element the canvas created. */
  destroy(): void;
}
