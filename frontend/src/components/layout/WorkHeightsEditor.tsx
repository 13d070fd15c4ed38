import { useState } from 'react';
import type { LayoutContent } from '@shared/schemas/layout';
import { parseNumber } from '../../editor/armForm';
import { setWorkHeights } from '../../editor/layoutEdits';
import { Button } from '../Button';

export interface WorkHeightsEditorProps {
  content: LayoutContent;
  readOnly: boolean;
  onEdit(next: LayoutContent, label: string): void;
  /** The height whose reach band the plan draws, mm (null = none). */
  bandHeight: number | null;
  onBandHeight(h: number | null): void;
}

const mm = new Intl.NumberFormat(undefined, { maximumFractionDigits: 1 });

/** Work heights (mm above the floor) as a small list, and which one's reach band the plan shows. */
export function WorkHeightsEditor({ content, readOnly, onEdit, bandHeight, onBandHeight }: WorkHeightsEditorProps) {
  const [text, setText] = useState('');
  const [error, setError] = useState<string | null>(null);
  const heights = content.workHeights;

  function add() {
    const h = parseNumber(text);
    if (h === null) {
      setError('Type a height in mm');
      return;
    }
    if (h < -5000 || h > 20000) {
      setError('Between −5 000 and 20 000 mm');
      return;
    }
    if (heights.length >= 20) {
      setError('At most 20 work heights');
      return;
    }
    setError(null);
    setText('');
    onEdit(setWorkHeights(content, [...heights, h]), `Add work height ${mm.format(h)} mm`);
    if (bandHeight === null) onBandHeight(Math.round(h * 10) / 10);
  }

  return (
    <section aria-labelledby="heights-heading" className="flex flex-wrap items-center gap-x-3 gap-y-1.5">
      <h2 id="heights-heading" className="text-xs font-bold tracking-wide text-ink-muted uppercase">
        Work heights (mm)
      </h2>
      <ul className="flex flex-wrap gap-1.5" aria-label="Work heights">
        {heights.length === 0 && <li className="text-xs text-ink-muted">none yet — add the heights where work happens</li>}
        {heights.map((h) => (
          <li key={h} className="inline-flex items-center gap-1 rounded-control border border-rule bg-paper px-2 py-0.5 text-xs tabular-nums">
            {mm.format(h)}
            {!readOnly && (
              <button
                type="button"
                aria-label={`Remove work height ${mm.format(h)} mm`}
                className="text-ink-faint hover:text-finding-critical"
                onClick={() => {
                  onEdit(setWorkHeights(content, heights.filter((x) => x !== h)), `Remove work height ${mm.format(h)} mm`);
                  if (bandHeight === h) onBandHeight(null);
                }}
              >
                ×
              </button>
            )}
          </li>
        ))}
      </ul>
      {!readOnly && (
        <div className="flex items-start gap-1">
          <div className="flex w-28 flex-col">
            <input
              aria-label="New work height (mm)"
              inputMode="decimal"
              value={text}
              placeholder="e.g. 850"
              onChange={(e) => setText(e.target.value)}
              onKeyDown={(e) => {
                if (e.key === 'Enter') {
                  e.preventDefault();
                  add();
                }
              }}
              aria-invalid={error ? true : undefined}
              className="h-7 w-full rounded-control border border-rule-strong bg-paper-raised px-2 text-xs tabular-nums"
            />
            {error && (
              <span role="alert" className="mt-0.5 text-xs text-finding-critical">
                {error}
              </span>
            )}
          </div>
          <Button size="sm" onClick={add}>
            Add
          </Button>
        </div>
      )}
      <label className="ml-auto flex items-center gap-2 text-xs text-ink-muted">
        Reach band drawn at
        <select
          aria-label="Reach band at height"
          value={bandHeight === null ? '' : String(bandHeight)}
          onChange={(e) => onBandHeight(e.target.value === '' ? null : Number(e.target.value))}
          className="h-7 rounded-control border border-rule-strong bg-paper-raised px-1 text-xs tabular-nums text-ink"
        >
          <option value="">no band</option>
          {heights.map((h) => (
            <option key={h} value={h}>
              {mm.format(h)} mm
            </option>
          ))}
        </select>
      </label>
    </section>
  );
}
