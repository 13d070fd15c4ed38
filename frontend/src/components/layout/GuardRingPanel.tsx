import { useState } from 'react';
import { DEFAULT_FENCE_SYSTEM, FENCE_MESH_SHAPES, type FenceSystemInput } from '@shared/schemas/fenceProposal';
import type { LayoutContent } from '@shared/schemas/layout';
import { errorMessage, isApiError } from '../../api/client';
import { useFenceProposal, type FenceProposalDto } from '../../api/fenceProposals';
import { Button } from '../Button';
import { BomTable } from './BomTable';

interface Props {
  layoutId: number;
  layoutName: string;
  content: LayoutContent;
  /** The proposal shown on the plan (null while there is none). */
  proposal: FenceProposalDto | null;
  onProposal(p: FenceProposalDto | null): void;
  onAccept(p: FenceProposalDto): void;
  onClose(): void;
}

type Form = Record<'panelWidthsMm' | 'panelHeightMm' | 'meshMm' | 'postWidthMm' | 'clearanceMm' | 'doorWidthsMm', string> & { meshShape: string; useWalls: boolean };

const D = DEFAULT_FENCE_SYSTEM;
const INITIAL: Form = {
  panelWidthsMm: D.panelWidthsMm.join(', '),
  panelHeightMm: String(D.panelHeightMm),
  meshMm: String(D.meshMm),
  meshShape: D.meshShape,
  postWidthMm: String(D.postWidthMm),
  clearanceMm: String(D.clearanceMm),
  doorWidthsMm: D.doorWidthsMm.join(', '),
  useWalls: D.useWalls,
};

const list = (s: string) => s.split(/[\s,;]+/).filter(Boolean).map(Number);
const num = (s: string) => (s.trim() === '' ? Number.NaN : Number(s));

function toSystem(f: Form): FenceSystemInput {
  return {
    panelWidthsMm: list(f.panelWidthsMm),
    panelHeightMm: num(f.panelHeightMm),
    meshMm: num(f.meshMm),
    meshShape: f.meshShape as FenceSystemInput['meshShape'],
    postWidthMm: num(f.postWidthMm),
    clearanceMm: num(f.clearanceMm),
    doorWidthsMm: list(f.doorWidthsMm),
    useWalls: f.useWalls,
  };
}

const FIELDS: ReadonlyArray<{ key: keyof Omit<Form, 'meshShape' | 'useWalls'>; label: string; hint?: string }> = [
  { key: 'panelWidthsMm', label: 'Panel widths (mm)', hint: 'the widths the supplier stocks, separated by commas' },
  { key: 'panelHeightMm', label: 'Panel height (mm)' },
  { key: 'meshMm', label: 'Mesh opening (mm)' },
  { key: 'postWidthMm', label: 'Post width (mm)' },
  { key: 'clearanceMm', label: 'Clearance (mm)', hint: 'kept beyond the ISO 13857 distance; 150 mm is common practice' },
  { key: 'doorWidthsMm', label: 'Door widths (mm)', hint: 'clear widths, single and double leaf' },
];

/** Fence-system form, the proposal's notes and bill of materials, and Accept / Discard. */
export function GuardRingPanel({ layoutId, layoutName, content, proposal, onProposal, onAccept, onClose }: Props) {
  const [form, setForm] = useState<Form>(INITIAL);
  const propose = useFenceProposal(layoutId);
  const err = propose.error;
  const fieldError = (k: string) => (isApiError(err, 400) ? Object.entries(err.fields).find(([f]) => f === k || f.startsWith(`${k}.`))?.[1] : undefined);
  const set = <K extends keyof Form>(k: K, v: Form[K]) => setForm((f) => ({ ...f, [k]: v }));

  return (
    <section aria-label="Guard ring proposal" className="flex flex-col gap-3 text-xs" data-guard-ring-panel>
      <div className="flex items-center justify-between">
        <h2 className="text-sm font-bold">Propose guard ring</h2>
        <Button size="sm" variant="quiet" onClick={onClose} aria-label="Close the proposal">
          ✕
        </Button>
      </div>
      <form
        className="grid grid-cols-2 gap-x-2 gap-y-1.5"
        onSubmit={(e) => {
          e.preventDefault();
          propose.mutate({ system: toSystem(form), content }, { onSuccess: (p) => onProposal(p) });
        }}
      >
        {FIELDS.map((f) => (
          <label key={f.key} className={f.key.endsWith('WidthsMm') ? 'col-span-2 flex flex-col gap-0.5' : 'flex flex-col gap-0.5'}>
            <span className="font-bold">{f.label}</span>
            <input
              name={f.key}
              value={form[f.key]}
              onChange={(e) => set(f.key, e.target.value)}
              aria-invalid={fieldError(f.key) ? true : undefined}
              className="h-7 rounded-control border border-rule-strong bg-paper-raised px-1.5 tabular-nums"
            />
            {fieldError(f.key) ? <span className="text-finding-critical">{fieldError(f.key)}</span> : f.hint ? <span className="text-ink-faint">{f.hint}</span> : null}
          </label>
        ))}
        <label className="flex flex-col gap-0.5">
          <span className="font-bold">Mesh shape</span>
          <select name="meshShape" value={form.meshShape} onChange={(e) => set('meshShape', e.target.value)} className="h-7 rounded-control border border-rule-strong bg-paper-raised px-1">
            {FENCE_MESH_SHAPES.map((s) => (
              <option key={s} value={s}>
                {s}
              </option>
            ))}
          </select>
        </label>
        <label className="flex items-center gap-1.5 self-end pb-1">
          <input type="checkbox" name="useWalls" checked={form.useWalls} onChange={(e) => set('useWalls', e.target.checked)} />
          <span className="font-bold">Walls may close the ring</span>
        </label>
        <div className="col-span-2 flex items-center gap-2 pt-1">
          <Button size="sm" variant="primary" type="submit" busy={propose.isPending}>
            Propose
          </Button>
          <Button size="sm" variant="quiet" onClick={() => setForm(INITIAL)}>
            Defaults
          </Button>
        </div>
      </form>
      {err && <p role="alert" className="text-finding-critical">{errorMessage(err)}</p>}
      {proposal && (
        <div className="flex flex-col gap-2" data-guard-ring-result>
          <p className="text-ink-muted">
            {proposal.rings.length} guard ring{proposal.rings.length === 1 ? '' : 's'}, {proposal.parts.doors.length} door{proposal.parts.doors.length === 1 ? '' : 's'} — shown dashed on the plan.
          </p>
          <BomTable bom={proposal.bom} lengthMm={proposal.lengthMm} areaM2={proposal.areaEnclosedM2} fileName={`${layoutName.replace(/[^\w.-]+/g, '-')}-guard-ring-parts.csv`} label="Proposed fence parts" layoutName={layoutName} />
          <ul className="flex list-disc flex-col gap-1 pl-4 text-ink-muted">
            {proposal.notes.map((n) => (
              <li key={n}>{n}</li>
            ))}
          </ul>
          <div className="flex gap-2">
            <Button size="sm" variant="primary" onClick={() => onAccept(proposal)}>
              Accept
            </Button>
            <Button size="sm" onClick={() => onProposal(null)}>
              Discard
            </Button>
          </div>
        </div>
      )}
    </section>
  );
}
