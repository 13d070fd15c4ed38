const R = 8.5;
const GAP_AT_DEG = 72;
const GAP_HALF_DEG = 18;

function onRing(deg: number): [number, number] {
  const a = (deg * Math.PI) / 180;
  return [12 + R * Math.cos(a), 12 + R * Math.sin(a)];
}

const [sx, sy] = onRing(GAP_AT_DEG + GAP_HALF_DEG);
const [ex, ey] = onRing(GAP_AT_DEG - GAP_HALF_DEG);
const RING = `M${sx.toFixed(2)} ${sy.toFixed(2)} A${R} ${R} 0 1 1 ${ex.toFixed(2)} ${ey.toFixed(2)}`;
const POSTS = [0, 1, 3, 4, 5, 6, 7, 8, 9].map((i) => onRing(i * 36));

/**
 * The product mark: a ring of fence posts with one opening around a centre point — a reach
 * circle and its guard with an access gap.
 */
export function RingfenceMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 24 24" className={className} aria-hidden fill="none" stroke="currentColor">
      <path d={RING} strokeWidth="1.4" strokeLinecap="round" />
      {POSTS.map(([x, y], i) => (
        <circle key={i} cx={x} cy={y} r="1.3" fill="currentColor" stroke="none" />
      ))}
      <circle cx="12" cy="12" r="2.1" fill="currentColor" stroke="none" />
    </svg>
  );
}
