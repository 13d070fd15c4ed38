import { useMemo, useState } from 'react';
import type { PlacementResult } from '@shared/analysis';
import type { LayoutContent } from '@shared/schemas/layout';
import { issueSentence } from '@shared/schemas/labels';
import { AutoLayoutInput, PlacementSearchInput } from '@shared/schemas/placement';
import { chosenPoints, pointTags, type PointChoice } from '../../editor/placementEdits';
import type { PlacementWork } from '../../editor/usePlacementWorker';
import { Button } from '../Button';
import { SelectField, TextField } from '../Field';
import { marginScale } from './placementMapDraw';

export interface PlacementPanelProps {
  content: LayoutContent;
  armModels: Array<{ id: number; name: string }>;
  /** The selected work point, offered as "the selected point". */
  selectedPointId: string | null;
  work: PlacementWork;
  /** The reason under the pointer on the map, or null. */
  hover: string | null;
  readOnly: boolean;
  onSearch(request: PlacementSearchInput): void;
  onPropose(request: AutoLayoutInput): void;
  onPlace(index: number): void;
  onAcceptProposal(): void;
  onClose(): void;
}

const num = (s: string) => (s.trim() === '' ? NaN : Number(s));

function choiceOf(v: string, selected: string | null): PointChoice {
  if (v === 'selected' && selected) return { kind: 'selected', id: selected };
  if (v.startsWith('tag:')) return { kind: 'tag', tag: v.slice(4) };
  return v === 'all' ? { kind: 'all' } : { kind: 'unassigned' };
}

/** "Find a place": where one arm may stand for chosen work points; and a proposal of several arms. */
export function PlacementPanel(p: PlacementPanelProps) {
  const [mode, setMode] = useState<'one' | 'many'>('one');
  const [who, setWho] = useState(() => (p.armModels[0] ? `model:${p.armModels[0].id}` : ''));
  const [points, setPoints] = useState(p.selectedPointId ? 'selected' : 'unassigned');
  const [f, setF] = useState({ minMargin: '20', yawMin: '-180', yawMax: '180', yawStep: '5', mount: '0', j1Min: '', j1Max: '' });
  const [counts, setCounts] = useState<Record<number, string>>({});
  const [error, setError] = useState<string | null>(null);
  const tags = useMemo(() => pointTags(p.content), [p.content]);
  const ids = chosenPoints(p.content, choiceOf(points, p.selectedPointId));
  const running = p.work.state.kind === 'running';
  const set = (k: keyof typeof f) => (e: { target: { value: string } }) => setF((o) => ({ ...o, [k]: e.target.value }));

  function search() {
    const placed = who.startsWith('arm:') ? p.content.arms.find((a) => a.id === who.slice(4)) : undefined;
    const armModelId = placed ? placed.armModelId : Number(who.slice(6));
    const restrict = f.j1Min.trim() || f.j1Max.trim() ? { j1Min: num(f.j1Min), j1Max: num(f.j1Max) } : undefined;
    const r = PlacementSearchInput.safeParse({
      armModelId, armId: placed?.id, pointIds: ids, minMarginMm: num(f.minMargin), yawMinDeg: num(f.yawMin), yawMaxDeg: num(f.yawMax), yawStepDeg: num(f.yawStep),
      mountHeightMm: num(f.mount), restrict, gridMm: 10,
    });
    if (!r.success) return setError(r.error.issues[0] ? issueSentence(r.error.issues[0]) : 'Check the fields');
    setError(null);
    p.onSearch(r.data);
  }

  function propose() {
    const models = p.armModels.map((m) => ({ armModelId: m.id, count: Math.trunc(num(counts[m.id] ?? '0')) })).filter((m) => m.count > 0);
    const r = AutoLayoutInput.safeParse({ models, pointIds: ids, minMarginMm: num(f.minMargin), mountHeightMm: num(f.mount), seed: 1, timeLimitS: 10 });
    if (!r.success) return setError(r.error.issues[0] ? issueSentence(r.error.issues[0]) : 'Check the fields');
    setError(null);
    p.onPropose(r.data);
  }

  const result = p.work.result;
  const proposal = p.work.proposal;
  return (
    <section className="flex min-h-0 flex-col gap-3 overflow-y-auto rounded-control border border-rule bg-paper-raised p-3" aria-label="Find a place" data-placement-panel>
      <div className="flex items-center gap-2">
        <h2 className="text-sm font-bold">Find a place</h2>
        <div role="tablist" aria-label="What to search" className="ml-auto flex gap-1">
          <Button size="sm" variant={mode === 'one' ? 'primary' : 'quiet'} role="tab" aria-selected={mode === 'one'} onClick={() => setMode('one')}>One arm</Button>
          <Button size="sm" variant={mode === 'many' ? 'primary' : 'quiet'} role="tab" aria-selected={mode === 'many'} onClick={() => setMode('many')}>Propose arms</Button>
        </div>
        <Button size="sm" variant="quiet" onClick={p.onClose} aria-label="Close Find a place">Close</Button>
      </div>
      <p className="text-xs text-ink-muted">
        A planning estimate from nominal kinematics (reach of the tool point; spaces of the whole moving arm at the link sizes entered); it does not replace a risk assessment or the guarding design of a competent person under local codes.
      </p>
      {mode === 'one' ? (
        <SelectField
          label="Arm"
          value={who}
          onChange={(e) => {
            setWho(e.target.value);
            // A placed arm keeps its mount height and restricting limits unless they are changed here.
            const a = e.target.value.startsWith('arm:') ? p.content.arms.find((x) => x.id === e.target.value.slice(4)) : undefined;
            if (a) setF((o) => ({ ...o, mount: String(a.mountHeight), j1Min: a.restrict ? String(a.restrict.j1Min) : '', j1Max: a.restrict ? String(a.restrict.j1Max) : '' }));
          }}
        >
          <optgroup label="New arm of a model">
            {p.armModels.map((m) => <option key={m.id} value={`model:${m.id}`}>{m.name}</option>)}
          </optgroup>
          {p.content.arms.length > 0 && (
            <optgroup label="Move a placed arm">
              {p.content.arms.map((a) => <option key={a.id} value={`arm:${a.id}`}>{a.id}{a.label ? ` — ${a.label}` : ''}</option>)}
            </optgroup>
          )}
        </SelectField>
      ) : (
        <fieldset className="flex flex-col gap-1">
          <legend className="text-xs font-bold tracking-wide text-ink-muted uppercase">Models and how many</legend>
          {p.armModels.map((m) => (
            <TextField key={m.id} label={m.name} inputMode="numeric" value={counts[m.id] ?? '0'} onChange={(e) => setCounts((c) => ({ ...c, [m.id]: e.target.value }))} />
          ))}
        </fieldset>
      )}
      <SelectField label="Work points" value={points} onChange={(e) => setPoints(e.target.value)} hint={`${ids.length} point${ids.length === 1 ? '' : 's'}`}>
        {p.selectedPointId && <option value="selected">The selected point ({p.selectedPointId})</option>}
        <option value="unassigned">All without an arm</option>
        <option value="all">All</option>
        {tags.map((t) => <option key={t} value={`tag:${t}`}>Tag {t}</option>)}
      </SelectField>
      <div className="grid grid-cols-2 gap-2">
        <TextField label="Min margin (mm)" inputMode="decimal" value={f.minMargin} onChange={set('minMargin')} />
        <TextField label="Mount height (mm)" inputMode="decimal" value={f.mount} onChange={set('mount')} />
        {mode === 'one' && (
          <>
            <TextField label="Yaw from (°)" inputMode="decimal" value={f.yawMin} onChange={set('yawMin')} />
            <TextField label="Yaw to (°)" inputMode="decimal" value={f.yawMax} onChange={set('yawMax')} />
            <TextField label="Yaw step (°)" inputMode="decimal" value={f.yawStep} onChange={set('yawStep')} />
            <span />
            <TextField label="Restrict J1 min (°)" inputMode="decimal" value={f.j1Min} onChange={set('j1Min')} placeholder="none" />
            <TextField label="Restrict J1 max (°)" inputMode="decimal" value={f.j1Max} onChange={set('j1Max')} placeholder="none" />
          </>
        )}
      </div>
      {ids.length === 0 && <p className="text-sm text-ink-muted" data-placement-empty>No work points chosen: add work points on the plan, or choose "All" or a tag above.</p>}
      {error && <p role="alert" className="text-sm text-finding-critical">{error}</p>}
      <div className="flex items-center gap-2">
        {running ? (
          <Button size="sm" onClick={p.work.cancel}>Cancel</Button>
        ) : (
          <Button size="sm" variant="primary" disabled={ids.length === 0 || (mode === 'one' && !who)} onClick={mode === 'one' ? search : propose}>
            {mode === 'one' ? 'Search' : 'Propose'}
          </Button>
        )}
        {running && (
          <progress className="flex-1" max={1} value={p.work.state.kind === 'running' ? p.work.state.progress : 0} aria-label="Search progress" data-placement-progress />
        )}
      </div>
      {p.work.state.kind === 'error' && <p role="alert" className="text-sm text-finding-critical">{p.work.state.message}</p>}
      {mode === 'one' && p.work.map && <Legend work={p.work} hover={p.hover} />}
      {mode === 'one' && result && <Candidates result={result} readOnly={p.readOnly} onPlace={p.onPlace} />}
      {mode === 'many' && proposal && (
        <div className="flex flex-col gap-2" data-proposal>
          <table className="text-sm">
            <thead>
              <tr className="text-left text-xs text-ink-muted"><th /><th>Current</th><th>Proposal</th></tr>
            </thead>
            <tbody>
              <tr><th className="text-left font-normal">Arms</th><td>{p.content.arms.length}</td><td>{proposal.content.arms.length}</td></tr>
              <tr><th className="text-left font-normal">Work points not reached</th><td>{proposal.scores.current.unreachedPoints}</td><td>{proposal.scores.proposal.unreachedPoints}</td></tr>
              <tr><th className="text-left font-normal">Shared zone (m²)</th><td>{proposal.scores.current.sharedZoneM2}</td><td>{proposal.scores.proposal.sharedZoneM2}</td></tr>
              <tr><th className="text-left font-normal">Guarded area (m²)</th><td>{proposal.scores.current.guardedAreaM2}</td><td>{proposal.scores.proposal.guardedAreaM2}</td></tr>
            </tbody>
          </table>
          {proposal.result.unreachable.length > 0 && <p className="text-sm text-finding-critical">No model reaches {proposal.result.unreachable.join(', ')} from any base.</p>}
          {proposal.result.unassigned.length > 0 && <p className="text-sm text-finding-critical">No arm left{proposal.result.timedOut ? ' in the time' : ''} for {proposal.result.unassigned.join(', ')}.</p>}
          <div className="flex gap-2">
            <Button size="sm" variant="primary" disabled={p.readOnly} onClick={p.onAcceptProposal}>Take the proposal</Button>
            <Button size="sm" onClick={p.work.clear}>Discard</Button>
          </div>
        </div>
      )}
    </section>
  );
}

function Legend({ work, hover }: { work: PlacementWork; hover: string | null }) {
  const map = work.map!.map;
  const scale = marginScale(map);
  const [lo, hi] = scale.domain();
  const stops = Array.from({ length: 6 }, (_, i) => scale(lo + ((hi - lo) * i) / 5)).join(', ');
  const any = map.worstMarginMm.some((v) => !Number.isNaN(v));
  return (
    <div className="flex flex-col gap-1" data-placement-legend>
      {any ? (
        <>
          <div className="h-3 rounded" style={{ background: `linear-gradient(to right, ${stops})` }} aria-hidden />
          <div className="flex justify-between text-xs text-ink-muted"><span>{lo.toFixed(0)} mm</span><span>worst margin</span><span>{hi.toFixed(0)} mm</span></div>
        </>
      ) : (
        <p className="text-xs text-ink-muted">No feasible cell yet; clear cells fail a test (point at the map for the reason).</p>
      )}
      <p className="min-h-4 text-xs" aria-live="polite" data-placement-hover>{hover ?? ''}</p>
    </div>
  );
}

function Candidates({ result, readOnly, onPlace }: { result: PlacementResult; readOnly: boolean; onPlace(i: number): void }) {
  if (result.candidates.length === 0) {
    return (
      <div className="flex flex-col gap-1" data-placement-limits>
        <p className="text-sm font-bold">No spot qualifies. What limits each point:</p>
        <ul className="list-disc pl-5 text-sm">
          {result.limits.map((l) => <li key={l.pointId}>{l.reason}</li>)}
        </ul>
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-1">
      <p className="text-xs text-ink-muted">Feasible area {result.feasibleAreaM2.toFixed(3)} m². Best first: largest worst margin, then least shared zone, then shortest guard line.</p>
      <ol className="flex flex-col gap-1" data-placement-candidates>
        {result.candidates.map((c, i) => (
          <li key={`${c.x},${c.y}`}>
            <Button size="sm" className="w-full justify-start text-left" disabled={readOnly} onClick={() => onPlace(i)} data-candidate-button={i + 1}>
              {i + 1}. x {c.x.toFixed(0)}, y {c.y.toFixed(0)}, yaw {c.yawDeg}° — margin {c.worstMarginMm.toFixed(0)} mm, shared {c.sharedZoneM2} m²
            </Button>
          </li>
        ))}
      </ol>
    </div>
  );
}
