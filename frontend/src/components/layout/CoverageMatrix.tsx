import { FAR_MM } from '@shared/analysis';
import { isReached } from '@shared/analysis';
import { useEffect, useEffectEvent, useLayoutEffect, useMemo, useRef, useState } from 'react';
import { axisBottom, scaleLinear, select } from 'd3';
import { cn } from '../../lib/cn';
import type { LayoutPanelProps } from './panelTypes';
import {
  buildCoverageMatrix,
  cellAt,
  MARGIN_COLOURS,
  marginColourScale,
  marginScaleSpan,
  visibleRows,
  type CoverageSort,
  type MatrixGeometry,
} from './coverageMatrixModel';

const ROW_HEIGHT = 18;
const LABEL_WIDTH = 112;
const HEADER_HEIGHT = 30;
const VIEW_HEIGHT = 380;

const SORTS: Array<{ key: string; label: string; sort: CoverageSort }> = [
  { key: 'worst', label: 'Least covered first', sort: { by: 'worst', dir: 'asc' } },
  { key: 'best', label: 'Best covered first', sort: { by: 'worst', dir: 'desc' } },
  { key: 'layout', label: 'Layout order', sort: { by: 'layout' } },
];

const fmt = (m: number) => `${m < 0 ? '−' : '+'}${Math.abs(m).toFixed(Math.abs(m) < 100 ? 1 : 0)}`;

/**
 * Points × arms heat map of reach margins (red = short, green = reached), sortable by the
 * least-covered arm-independent margin or by one arm; hover tells point, arm and margin, a click
 * selects the point.
 *
 * Drawn on one canvas the size of the viewport, redrawn for the rows in view on scroll: the DOM
 * holds a spacer and one canvas whatever the point count, so 10⁴ points × tens of arms cost a
 * few hundred filled rectangles per frame instead of 10⁵ SVG or table nodes to lay out and hit-test.
 */
export function CoverageMatrix({ content, analysis, onSelect, selected }: LayoutPanelProps) {
  const armIds = useMemo(() => content.arms.map((a) => a.id), [content.arms]);
  const armLabel = useMemo(() => new Map(content.arms.map((a) => [a.id, a.label])), [content.arms]);
  const [sort, setSort] = useState<CoverageSort>(SORTS[0].sort);
  // An arm that left the layout cannot stay the sort key.
  const liveSort: CoverageSort = sort.by === 'arm' && !armIds.includes(sort.arm) ? SORTS[0].sort : sort;
  const sortKey = liveSort.by === 'arm' ? `arm:${liveSort.arm}` : liveSort.by === 'layout' ? 'layout' : liveSort.dir === 'asc' ? 'worst' : 'best';
  // liveSort is the sort state itself or a module constant, so it changes only when the sort does.
  const matrix = useMemo(
    () => buildCoverageMatrix(content.workPoints, armIds, analysis?.coverage ?? null, liveSort),
    [content.workPoints, armIds, analysis, liveSort],
  );
  const span = marginScaleSpan(matrix.maxAbs);
  const colour = useMemo(() => marginColourScale(span), [span]);
  const cellWidth = armIds.length <= 8 ? 56 : armIds.length <= 20 ? 36 : 22;
  const geometry: MatrixGeometry = { labelWidth: LABEL_WIDTH, cellWidth, rowHeight: ROW_HEIGHT };
  const width = LABEL_WIDTH + armIds.length * cellWidth;
  const rows = matrix.ids.length;
  const bodyHeight = rows * ROW_HEIGHT;
  const scroller = useRef<HTMLDivElement>(null);
  // The scroller's inner height (less borders and a horizontal scroll bar) fixes the canvas height.
  const [viewHeight, setViewHeight] = useState(VIEW_HEIGHT - 2);
  // The scroller exists only while there are rows and arms: measure it again when it appears.
  const hasBody = rows > 0 && armIds.length > 0;
  useLayoutEffect(() => {
    const el = scroller.current;
    if (!el) return;
    const measure = () => setViewHeight(el.clientHeight);
    measure();
    const ro = new ResizeObserver(measure);
    ro.observe(el);
    return () => ro.disconnect();
  }, [hasBody]);
  const canvasHeight = Math.max(0, Math.min(bodyHeight, viewHeight - HEADER_HEIGHT));

  const canvas = useRef<HTMLCanvasElement>(null);
  const [scrollTop, setScrollTop] = useState(0);
  const [hover, setHover] = useState<{ row: number; col: number | null; x: number; y: number } | null>(null);
  const selectedRow = selected?.kind === 'point' ? matrix.ids.indexOf(selected.id) : -1;

  useLayoutEffect(() => {
    const el = canvas.current;
    const ctx = el?.getContext('2d');
    if (!el || !ctx) return;
    const dpr = window.devicePixelRatio || 1;
    if (el.width !== Math.round(width * dpr) || el.height !== Math.round(canvasHeight * dpr)) {
      el.width = Math.round(width * dpr);
      el.height = Math.round(canvasHeight * dpr);
    }
    ctx.setTransform(dpr, 0, 0, dpr, 0, 0);
    ctx.clearRect(0, 0, width, canvasHeight);
    const [first, last] = visibleRows(scrollTop, canvasHeight, rows, ROW_HEIGHT);
    const k = armIds.length;
    ctx.font = '12px Lato, ui-sans-serif, system-ui, sans-serif';
    ctx.textBaseline = 'middle';
    for (let r = first; r < last; r++) {
      const y = r * ROW_HEIGHT - scrollTop;
      const best = matrix.best[r];
      const short = !Number.isNaN(best) && !isReached(best);
      if (r === selectedRow) {
        ctx.fillStyle = '#e3f1ef';
        ctx.fillRect(0, y, LABEL_WIDTH, ROW_HEIGHT);
      }
      if (short) {
        // The unreached mark: a red bar in the gutter and the id in red, so it reads without colour too.
        ctx.fillStyle = MARGIN_COLOURS.short;
        ctx.fillRect(0, y + 2, 4, ROW_HEIGHT - 4);
      }
      ctx.fillStyle = short ? MARGIN_COLOURS.short : Number.isNaN(best) ? '#8a91a0' : '#1c2230';
      ctx.font = `${short ? 'bold ' : ''}12px Lato, ui-sans-serif, system-ui, sans-serif`;
      ctx.fillText(`${matrix.ids[r]}${short ? ' ✕' : ''}`, 8, y + ROW_HEIGHT / 2, LABEL_WIDTH - 12);
      for (let c = 0; c < k; c++) {
        const m = matrix.margins[r * k + c];
        const x = LABEL_WIDTH + c * cellWidth;
        ctx.fillStyle = Number.isNaN(m) ? MARGIN_COLOURS.unknown : colour(m);
        ctx.fillRect(x, y, cellWidth - 1, ROW_HEIGHT - 1);
      }
      if (r === selectedRow) {
        ctx.strokeStyle = '#0b6e69';
        ctx.lineWidth = 2;
        ctx.strokeRect(1, y + 1, width - 2, ROW_HEIGHT - 2);
      }
    }
    if (hover && hover.col !== null && hover.row >= first && hover.row < last) {
      ctx.strokeStyle = '#1c2230';
      ctx.lineWidth = 1.5;
      ctx.strokeRect(LABEL_WIDTH + hover.col * cellWidth + 0.75, hover.row * ROW_HEIGHT - scrollTop + 0.75, cellWidth - 2.5, ROW_HEIGHT - 2.5);
    }
  }, [matrix, colour, scrollTop, canvasHeight, width, cellWidth, rows, armIds.length, selectedRow, hover]);

  // Bring a point selected elsewhere into view: when the selection changes, not when a sort or a
  // resize moves its row, so the row and height are read as they are at that moment.
  const bringSelectedIntoView = useEffectEvent(() => {
    const el = scroller.current;
    if (!el || selectedRow < 0) return;
    const top = selectedRow * ROW_HEIGHT;
    if (top < el.scrollTop || top + ROW_HEIGHT > el.scrollTop + canvasHeight) el.scrollTop = Math.max(0, top - canvasHeight / 3);
  });
  useEffect(() => {
    bringSelectedIntoView();
  }, [selected?.id, selected?.kind]);

  const pick = (event: React.MouseEvent<HTMLCanvasElement>) => {
    const rect = event.currentTarget.getBoundingClientRect();
    const hit = cellAt(event.clientX - rect.left, event.clientY - rect.top + scrollTop, rows, armIds.length, geometry);
    return hit ? { ...hit, x: event.clientX - rect.left, y: event.clientY - rect.top } : null;
  };
  const hovered = hover ? describe(hover.row, hover.col) : null;
  function describe(row: number, col: number | null) {
    const id = matrix.ids[row];
    if (col === null) {
      const best = matrix.best[row];
      if (best === -Infinity) return `${id}: every arm is more than ${FAR_MM} mm short — not reached`;
      return Number.isNaN(best) ? `${id}: not analysed` : `${id}: best ${fmt(best)} mm${!isReached(best) ? ' — not reached' : ''}`;
    }
    const arm = armIds[col];
    const m = matrix.margins[row * armIds.length + col];
    const name = armLabel.get(arm) ? `${arm} (${armLabel.get(arm)})` : arm;
    if (m === -Infinity) return `${id} · ${name}: more than ${FAR_MM} mm short`;
    return Number.isNaN(m) ? `${id} · ${name}: not analysed` : `${id} · ${name}: ${fmt(m)} mm ${!isReached(m) ? 'short' : 'to spare'}`;
  }

  const empty = armIds.length === 0 ? 'Place an arm to see which points it reaches.' : rows === 0 ? 'Add work points to see their coverage.' : null;

  return (
    <section aria-label="Coverage matrix" className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <label className="flex flex-col gap-1">
          <span className="text-xs font-bold tracking-wide text-ink-muted uppercase">Rows</span>
          <select
            value={sortKey}
            onChange={(event) => {
              const v = event.target.value;
              setSort(v.startsWith('arm:') ? { by: 'arm', arm: v.slice(4) } : SORTS.find((s) => s.key === v)!.sort);
            }}
            className="h-9 rounded-control border border-rule-strong bg-paper-raised px-2 text-sm"
          >
            {SORTS.map((s) => <option key={s.key} value={s.key}>{s.label}</option>)}
            {armIds.map((a) => <option key={a} value={`arm:${a}`}>Shortest for {a} first</option>)}
          </select>
        </label>
        <MarginLegend span={span} colour={colour} />
      </div>
      <p className="text-xs text-ink-muted" aria-live="polite">
        {rows} point{rows === 1 ? '' : 's'} × {armIds.length} arm{armIds.length === 1 ? '' : 's'}
        {analysis ? (matrix.unreached ? <>; <span className="font-bold text-finding-critical">{matrix.unreached} not reached</span> (marked ✕)</> : '; every analysed point is reached') : '; margins appear when the analysis has run'}
      </p>
      {empty ? (
        <p className="rounded-control border border-rule bg-paper-raised px-3 py-6 text-sm text-ink-muted">{empty}</p>
      ) : (
        <div className="relative">
          <div
            ref={scroller}
            onScroll={(event) => {
              setScrollTop(event.currentTarget.scrollTop);
              setHover(null);
            }}
            style={{ maxHeight: VIEW_HEIGHT }}
            className="overflow-auto rounded-control border border-rule bg-paper-raised"
          >
            <div style={{ width, height: HEADER_HEIGHT }} className="sticky top-0 z-10 flex border-b border-rule-strong bg-paper-sunk text-xs font-bold text-ink-muted">
              <span style={{ width: LABEL_WIDTH }} className="flex items-center px-2 uppercase">Point</span>
              {armIds.map((a) => (
                <button
                  key={a}
                  type="button"
                  title={`Sort by ${a}'s margin, shortest first`}
                  aria-pressed={liveSort.by === 'arm' && liveSort.arm === a}
                  onClick={() => setSort({ by: 'arm', arm: a })}
                  style={{ width: cellWidth }}
                  className={cn('truncate px-0.5 text-center hover:text-ink', liveSort.by === 'arm' && liveSort.arm === a && 'text-accent underline')}
                >
                  {a}
                </button>
              ))}
            </div>
            <div style={{ width, height: bodyHeight }} className="relative">
              <canvas
                ref={canvas}
                role="img"
                aria-label={`Coverage of ${rows} work points by ${armIds.length} arms; ${matrix.unreached} not reached. Arrow keys move the selection.`}
                tabIndex={0}
                style={{ width, height: canvasHeight, top: HEADER_HEIGHT }}
                className="sticky block cursor-pointer"
                onMouseMove={(event) => setHover(pick(event))}
                onMouseLeave={() => setHover(null)}
                onClick={(event) => {
                  const hit = pick(event);
                  if (hit) onSelect({ kind: 'point', id: matrix.ids[hit.row] });
                }}
                onKeyDown={(event) => {
                  if (event.key !== 'ArrowDown' && event.key !== 'ArrowUp') return;
                  event.preventDefault();
                  const next = Math.min(rows - 1, Math.max(0, selectedRow < 0 ? 0 : selectedRow + (event.key === 'ArrowDown' ? 1 : -1)));
                  onSelect({ kind: 'point', id: matrix.ids[next] });
                }}
              />
            </div>
          </div>
          {hover && hovered && (
            <div
              role="status"
              style={{ left: Math.min(hover.x + 14, width - 40), top: hover.y + HEADER_HEIGHT + 14 }}
              className="pointer-events-none absolute z-20 rounded-control border border-rule-strong bg-paper-raised px-2 py-1 text-xs whitespace-nowrap shadow"
            >
              {hovered}
            </div>
          )}
        </div>
      )}
    </section>
  );
}

/** The colour legend in mm: a gradient bar from −span (short) to +span (reached) with a d3 axis. */
function MarginLegend({ span, colour }: { span: number; colour: (m: number) => string }) {
  const axisRef = useRef<SVGGElement>(null);
  const w = 220;
  const x = useMemo(() => scaleLinear().domain([-span, span]).range([0, w]), [span]);
  useEffect(() => {
    if (!axisRef.current) return;
    const g = select(axisRef.current);
    g.call(axisBottom(x).ticks(5).tickSize(4).tickFormat((v) => `${Number(v) > 0 ? '+' : ''}${v}`));
    g.selectAll('text').attr('font-size', 10).attr('fill', '#586173');
    g.selectAll('line,path').attr('stroke', '#a9a497');
    return () => void g.selectAll('*').remove();
  }, [x]);
  const stops = useMemo(() => {
    const out: Array<{ offset: number; c: string }> = [];
    for (let i = 0; i <= 10; i++) {
      const m = -span + (i / 10) * span;
      out.push({ offset: (i / 10) * 50, c: colour(i === 10 ? -1e-9 : m) });
    }
    for (let i = 0; i <= 10; i++) out.push({ offset: 50 + (i / 10) * 50, c: colour((i / 10) * span) });
    return out;
  }, [span, colour]);
  const id = `margin-legend-${span}`;
  return (
    <figure className="flex flex-col text-xs text-ink-muted" aria-label={`Colour key: margin in mm from −${span} (short) to +${span} (reached)`}>
      <figcaption className="mb-0.5 flex justify-between px-4" style={{ width: w + 48 }}>
        <span>short</span>
        <span>margin, mm</span>
        <span>reached</span>
      </figcaption>
      <svg width={w + 48} height={30} aria-hidden>
        <defs>
          <linearGradient id={id}>
            {stops.map((s, i) => <stop key={i} offset={`${s.offset}%`} stopColor={s.c} />)}
          </linearGradient>
        </defs>
        <rect x={24} y={0} width={w} height={10} fill={`url(#${id})`} />
        <g ref={axisRef} transform="translate(24,10)" />
      </svg>
      <span className="flex items-center gap-1">
        <span className="inline-block h-2.5 w-3" style={{ background: MARGIN_COLOURS.unknown }} /> not analysed
        <span className="ml-2 inline-block h-2.5 w-1" style={{ background: MARGIN_COLOURS.short }} /> ✕ not reached
      </span>
    </figure>
  );
}
