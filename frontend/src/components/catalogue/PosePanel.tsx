import { useId } from 'react';
import { Button } from '../Button';
import type { PoseState } from './usePose';

const coord = new Intl.NumberFormat('en-GB', { minimumFractionDigits: 1, maximumFractionDigits: 1 });
// Negative zero and rounding noise read as 0.0, never −0.0.
const fmt = (v: number) => coord.format(Math.abs(v) < 0.05 ? 0 : v).replace(/,/g, ' ');

/** A message as a sentence (ends with a full stop). */
const sentence = (m: string) => (/[.!?]$/.test(m.trim()) ? m.trim() : `${m.trim()}.`);

/**
 * One slider and number box per axis in controller units (what the robot's own display reads:
 * degrees, mm for a stroke), and the tool point read out in the arm frame.
 */
export function PosePanel({ pose }: { pose: PoseState }) {
  const id = useId();
  const { axes, joints, result } = pose;
  if (axes.length === 0) {
    return <p className="text-sm text-ink-muted">The pose panel appears once the axes are complete.</p>;
  }
  return (
    <section aria-labelledby={`${id}-title`} className="flex flex-col gap-3">
      <div className="flex items-center justify-between">
        <h2 id={`${id}-title`} className="text-sm font-bold tracking-wide text-ink-muted uppercase">
          Pose
        </h2>
        <Button size="sm" variant="quiet" onClick={pose.reset}>
          Start pose
        </Button>
      </div>
      <div className="flex flex-col gap-2">
        {axes.map((axis, i) => {
          const unit = axis.kind === 'revolute' ? '°' : 'mm';
          const value = joints[i] ?? 0;
          const step = axis.kind === 'revolute' ? 0.5 : 1;
          return (
            <div key={`${axis.label}-${i}`} className="grid grid-cols-[3rem_1fr_6.5rem] items-center gap-3">
              <label htmlFor={`${id}-n${i}`} className="text-sm font-bold">
                {axis.label}
              </label>
              <input
                type="range"
                aria-label={`${axis.label} slider`}
                min={axis.min}
                max={axis.max}
                step={step}
                value={Math.min(axis.max, Math.max(axis.min, value))}
                onChange={(e) => pose.setJoint(i, Number(e.target.value))}
                className="w-full accent-[var(--color-accent)]"
              />
              <span className="flex items-center gap-1">
                <input
                  id={`${id}-n${i}`}
                  type="number"
                  step={step}
                  value={Number.isFinite(value) ? value : ''}
                  onChange={(e) => {
                    const v = e.target.valueAsNumber;
                    if (Number.isFinite(v)) pose.setJoint(i, v);
                  }}
                  className="h-8 w-20 rounded-control border border-rule-strong bg-paper-raised px-2 text-right text-sm tabular-nums"
                />
                <span className="w-6 text-xs text-ink-muted">{unit}</span>
              </span>
            </div>
          );
        })}
      </div>
      <p className="text-xs text-ink-muted">
        Controller values; limits {axes.map((a) => `${a.label} ${a.min}…${a.max}${a.kind === 'revolute' ? '°' : ' mm'}`).join(', ')}.
      </p>
      {result?.ok ? (
        <dl data-testid="tool-point" aria-label="Tool point in the arm frame" className="grid grid-cols-3 gap-2 rounded-control border border-rule bg-paper-sunk px-3 py-2 text-sm tabular-nums">
          {(['x', 'y', 'z'] as const).map((k) => (
            <div key={k}>
              <dt className="text-xs text-ink-muted">Tool point {k}, arm frame</dt>
              <dd className="font-bold">{fmt(result.tool[k])} mm</dd>
            </div>
          ))}
        </dl>
      ) : (
        <p role="alert" className="rounded-control border border-finding-warning/50 bg-finding-warning-wash px-3 py-2 text-sm">
          <strong className="text-finding-warning">
            {result && !result.ok && result.reason === 'not-assemblable' ? 'The linkage cannot assemble in this pose.' : 'This pose cannot be reached.'}
          </strong>{' '}
          {result && !result.ok ? sentence(result.message) : 'Complete the parameters first.'} The arm is drawn greyed in its last reachable pose.
        </p>
      )}
    </section>
  );
}
