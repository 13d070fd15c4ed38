import { useEffect, useLayoutEffect, useRef, useState, type ReactNode } from 'react';
import type { FeatureCollection, Geometry } from 'geojson';
import { cn } from '../lib/cn';
import { createPlanCanvas, type LayerStyles, type PlanBounds, type PlanCanvas, type PlanFeatureLike, type PlanPoint } from './planCanvas';

export interface PlanViewProps {
  /** The plan drawing in plan mm (x east, y north); drawn once per new object. */
  geometry: FeatureCollection<Geometry, PlanFeatureLike> | null | undefined;
  /** Style per layer name (colour, visibility…); changing it restyles without redrawing. */
  layerStyles: LayerStyles;
  /** The plan extent, mm; the view fits it when it changes. */
  bounds: PlanBounds | null | undefined;
  /** The plan point under the pointer (mm), or null when it leaves. Called per pointer move: keep it cheap. */
  onCursor?: (p: PlanPoint | null) => void;
  /** Receives the canvas once created (and null on unmount), for overlays (arms, boundaries, findings). */
  onCanvas?: (canvas: PlanCanvas | null) => void;
  /** Accessible name of the drawing. */
  label?: string;
  /** Show the grid at first. */
  grid?: boolean;
  className?: string;
  /** Drawn over the drawing's corner (e.g. the editor's key); positioned by its own classes. */
  overlay?: ReactNode;
}

const mmFormat = new Intl.NumberFormat(undefined, { maximumFractionDigits: 0 });

/** "x 12 050 mm · y 3 400 mm" — a plan point for the cursor read-out. */
export function formatPlanPoint(p: PlanPoint): string {
  return `x ${mmFormat.format(p.x)} mm · y ${mmFormat.format(p.y)} mm`;
}

const reducedMotion = () => typeof window !== 'undefined' && window.matchMedia?.('(prefers-reduced-motion: reduce)').matches;

/**
 * The plan drawing with its own controls (fit, zoom in/out, grid) and the pointer position in
 * plan mm. React owns the props; the d3 canvas (planCanvas.ts) owns everything under the svg.
 */
export function PlanView({ geometry, layerStyles, bounds, onCursor, onCanvas, label = 'Floor plan drawing', grid = false, className, overlay }: PlanViewProps) {
  const svgRef = useRef<SVGSVGElement>(null);
  const canvasRef = useRef<PlanCanvas | null>(null);
  const cursorRef = useRef<HTMLOutputElement>(null);
  const onCursorRef = useRef(onCursor);
  const onCanvasRef = useRef(onCanvas);
  const [gridOn, setGridOn] = useState(grid);
  // The canvas lives across renders and calls back through these, so they hold the latest props;
  // a layout effect runs before the effects below and before any pointer event of the new render.
  useLayoutEffect(() => {
    onCursorRef.current = onCursor;
    onCanvasRef.current = onCanvas;
  });

  // Order matters: this effect creates the canvas before the effects below feed it.
  useEffect(() => {
    const svg = svgRef.current;
    if (!svg) return;
    const canvas = createPlanCanvas(svg, {
      duration: reducedMotion() ? 0 : 250,
      onCursor: (p) => {
        // Written straight into the DOM: a React state update per pointer move would re-render the page.
        if (cursorRef.current) cursorRef.current.textContent = p ? formatPlanPoint(p) : '';
        onCursorRef.current?.(p);
      },
    });
    canvasRef.current = canvas;
    onCanvasRef.current?.(canvas);
    return () => {
      onCanvasRef.current?.(null);
      canvas.destroy();
      canvasRef.current = null;
    };
  }, []);

  useEffect(() => {
    canvasRef.current?.setStaticLayers(geometry?.features ?? []);
  }, [geometry]);

  useEffect(() => {
    canvasRef.current?.setLayerStyles(layerStyles);
  }, [layerStyles, geometry]);

  // Fitted again when the extent's numbers change, not when an equal bounds object arrives.
  const hasBounds = bounds != null;
  const { minX = 0, minY = 0, maxX = 0, maxY = 0 } = bounds ?? {};
  useEffect(() => {
    canvasRef.current?.setBounds(hasBounds ? { minX, minY, maxX, maxY } : null);
  }, [hasBounds, minX, minY, maxX, maxY]);

  useEffect(() => {
    canvasRef.current?.setGrid(gridOn);
  }, [gridOn]);

  return (
    <div className={cn('relative flex min-h-80 flex-col overflow-hidden rounded-control border border-rule bg-paper-raised', className)}>
      <div className="flex items-center gap-1 border-b border-rule bg-paper-sunk px-2 py-1.5" role="toolbar" aria-label="Drawing view">
        <ViewButton label="Fit the plan" onClick={() => canvasRef.current?.fit(undefined, { animate: true })}>
          Fit
        </ViewButton>
        <ViewButton label="Zoom in" onClick={() => canvasRef.current?.zoomBy(1.5)}>
          +
        </ViewButton>
        <ViewButton label="Zoom out" onClick={() => canvasRef.current?.zoomBy(1 / 1.5)}>
          −
        </ViewButton>
        <label className="ml-2 inline-flex items-center gap-1.5 text-xs text-ink-muted">
          <input type="checkbox" checked={gridOn} onChange={(e) => setGridOn(e.target.checked)} className="accent-accent" />
          Grid
        </label>
        <output ref={cursorRef} aria-label="Pointer position" className="ml-auto font-mono text-xs text-ink-muted tabular-nums" />
      </div>
      <svg
        ref={svgRef}
        role="img"
        aria-label={label}
        aria-roledescription="zoomable drawing"
        className="block min-h-0 w-full flex-1 cursor-crosshair select-none focus-visible:outline-offset-[-2px]"
      >
        <title>{`${label}. Drag to pan, scroll or use + and − to zoom, 0 to fit.`}</title>
      </svg>
      {overlay}
    </div>
  );
}

function ViewButton({ label, onClick, children }: { label: string; onClick: () => void; children: string }) {
  return (
    <button
      type="button"
      aria-label={label}
      title={label}
      onClick={onClick}
      className="inline-flex h-7 min-w-7 items-center justify-center rounded-control border border-rule-strong bg-paper-raised px-2 text-xs font-bold text-ink hover:bg-paper"
    >
      {children}
    </button>
  );
}
