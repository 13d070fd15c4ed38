import { useEffect, useRef } from 'react';
import { cn } from '../../lib/cn';
import { createProfileDrawing, formatMm, formatTolerance, type PoseView, type ProfileDrawing, type ProfileView } from './profileDrawing';

export interface ProfilePlotProps {
  profile: ProfileView | null;
  /** The arm drawn in one pose (side view), optional. */
  pose?: PoseView | null;
  /** The profile shown is the last valid one, the input has changed since. */
  stale?: boolean;
  /** Drawing height in px; the width follows the container. */
  height?: number;
  label?: string;
  /** A line under the figures saying which point the profile traces. */
  note?: string;
  className?: string;
}

/**
 * The side reach profile (profileDrawing.ts draws it with d3; React only hands it data), with the
 * reach figures repeated as text under the drawing for reading and screen readers.
 */
export function ProfilePlot({ profile, pose = null, stale = false, height = 420, label = 'Side reach profile', note, className }: ProfilePlotProps) {
  const boxRef = useRef<HTMLDivElement>(null);
  const svgRef = useRef<SVGSVGElement>(null);
  const drawingRef = useRef<ProfileDrawing | null>(null);

  useEffect(() => {
    const svg = svgRef.current;
    const box = boxRef.current;
    if (!svg || !box) return;
    const drawing = createProfileDrawing(svg);
    drawingRef.current = drawing;
    const observer = new ResizeObserver((entries) => {
      const w = Math.floor(entries[0]?.contentRect.width ?? 0);
      drawing.resize(w, height);
    });
    observer.observe(box);
    drawing.resize(Math.floor(box.clientWidth), height);
    return () => {
      observer.disconnect();
      drawing.destroy();
      drawingRef.current = null;
    };
  }, [height]);

  useEffect(() => {
    drawingRef.current?.update(profile, pose, { stale });
  }, [profile, pose, stale, height]);

  return (
    <figure className={cn('flex flex-col gap-2', className)}>
      <div ref={boxRef} className="w-full overflow-hidden rounded-control border border-rule bg-paper-raised">
        <svg ref={svgRef} role="img" aria-label={label} data-max-reach={profile ? Math.round(profile.maxReach) : undefined} style={{ display: 'block', height }} />
      </div>
      <figcaption className="flex flex-wrap gap-x-4 gap-y-1 text-sm" aria-live="polite">
        {profile ? (
          <>
            <span>
              Tool-point reach <strong data-testid="max-reach" className="tabular-nums">{formatMm(profile.maxReach)}</strong>
            </span>
            <span>
              Min reach <strong className="tabular-nums">{formatMm(profile.minReach)}</strong>
            </span>
            <span className="text-ink-muted">
              Boundary {formatTolerance(profile.toleranceMm)} ({profile.method === 'exact' ? 'traced from the joint limits' : 'sampled joint space'})
            </span>
            {profile.envelope?.length ? (
              <span className="text-ink-muted" data-testid="envelope-tolerance">
                Whole-arm envelope {formatTolerance(profile.envelopeToleranceMm ?? 0)} (links, tool and payload)
              </span>
            ) : null}
            {stale && <span className="font-bold text-finding-warning">Showing the last valid profile</span>}
          </>
        ) : (
          <span className="text-ink-muted">The profile appears once the parameters are complete.</span>
        )}
      </figcaption>
      {note && <p className="text-xs text-ink-muted">{note}</p>}
    </figure>
  );
}
