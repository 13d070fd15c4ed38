import { fourBarPose, grashofClass, type GrashofClass } from '@shared/kinematics';
import type { FourBarParams } from '@shared/schemas/armModel';

const CLASS_TEXT: Record<GrashofClass, string> = {
  'crank-rocker': 'crank-rocker (Grashof: the crank turns fully)',
  'double-crank': 'double crank (Grashof: ground is the shortest link)',
  'double-rocker': 'double rocker (Grashof: coupler is the shortest link)',
  'change-point': 'change point (s + l = p + q: it can fold flat)',
  'triple-rocker': 'triple rocker (non-Grashof: no link turns fully)',
};

export interface FourBarDiagramProps {
  fourBar: FourBarParams;
  /** Crank angle from the ground line (the upper arm), degrees — the current pose's. */
  crankDeg: number;
}

/**
 * The forearm drive's four-bar as a small sketch in the pose's crank angle (ground O2→O4 along
 * the upper arm, crank, coupler, rocker), with its Grashof class and transmission angle.
 */
export function FourBarDiagram({ fourBar, crankDeg }: FourBarDiagramProps) {
  const links = { a: fourBar.crank, b: fourBar.coupler, c: fourBar.rocker, d: fourBar.ground };
  const grashof = grashofClass(links);
  const pose = fourBarPose(links, crankDeg, fourBar.branch ?? 'open');
  const W = 320, H = 170, pad = 30;
  const span = links.d + Math.max(links.a, links.c) * 2;
  const k = Math.min((W - 2 * pad) / span, (H - 2 * pad) / (2 * Math.max(links.a, links.c, 1)));
  const ox = pad + Math.max(links.a, links.c) * k;
  const oy = H / 2;
  const X = (x: number) => ox + x * k;
  const Y = (y: number) => oy - y * k;
  const t2 = (crankDeg * Math.PI) / 180;
  const A = [links.a * Math.cos(t2), links.a * Math.sin(t2)] as const;
  const B = pose.ok ? ([links.d + links.c * Math.cos((pose.theta4Deg * Math.PI) / 180), links.c * Math.sin((pose.theta4Deg * Math.PI) / 180)] as const) : null;
  return (
    <figure className="flex flex-col gap-2">
      <h2 className="text-sm font-bold tracking-wide text-ink-muted uppercase">Forearm four-bar</h2>
      <svg viewBox={`0 0 ${W} ${H}`} width={W} height={H} role="img" aria-label="Four-bar of the forearm drive" className="rounded-control border border-rule bg-paper-raised">
        <line x1={X(0)} y1={Y(0)} x2={X(links.d)} y2={Y(0)} stroke="var(--color-ink-faint)" strokeWidth={3} strokeDasharray="6 4" />
        <line x1={X(0)} y1={Y(0)} x2={X(A[0])} y2={Y(A[1])} stroke="var(--color-accent)" strokeWidth={4} strokeLinecap="round" />
        {B && (
          <>
            <line x1={X(A[0])} y1={Y(A[1])} x2={X(B[0])} y2={Y(B[1])} stroke="var(--color-ink)" strokeWidth={3} strokeLinecap="round" />
            <line x1={X(links.d)} y1={Y(0)} x2={X(B[0])} y2={Y(B[1])} stroke="var(--color-reach)" strokeWidth={4} strokeLinecap="round" />
          </>
        )}
        {[[0, 0], A, ...(B ? [B] : []), [links.d, 0]].map(([x, y], i) => (
          <circle key={i} cx={X(x)} cy={Y(y)} r={4} fill="var(--color-paper-raised)" stroke="var(--color-ink)" strokeWidth={1.5} />
        ))}
        <text x={X(0) - 8} y={Y(0) + 4} fontSize={11} textAnchor="end" fill="var(--color-ink-muted)">
          J2
        </text>
        <text x={X(links.d) + 8} y={Y(0) + 4} fontSize={11} textAnchor="start" fill="var(--color-ink-muted)">
          J3
        </text>
        <text x={X(links.d / 2)} y={Y(0) - 6} fontSize={10} textAnchor="middle" fill="var(--color-ink-faint)">
          upper arm (ground)
        </text>
      </svg>
      <figcaption className="text-sm">
        <span data-testid="grashof-class">{CLASS_TEXT[grashof.kind]}</span>
        <span className="block text-xs text-ink-muted">
          {pose.ok
            ? `Crank ${crankDeg.toFixed(1)}° from the upper arm, transmission angle ${pose.transmissionDeg.toFixed(1)}°${pose.transmissionDeg < 40 ? ' — low, the drive is close to a dead point' : ''}.`
            : `At a crank angle of ${crankDeg.toFixed(1)}° the four-bar does not assemble.`}
        </span>
      </figcaption>
    </figure>
  );
}
