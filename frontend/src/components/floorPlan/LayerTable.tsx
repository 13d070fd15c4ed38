import { useState } from 'react';
import type { ImportLayer, LayerPatch, LayerRole } from '@shared/schemas/floorPlan';
import { LayerPatch as LayerPatchSchema } from '@shared/schemas/floorPlan';
import { issueSentence } from '@shared/schemas/labels';
import { cn } from '../../lib/cn';
import { ROLE_LABEL, ROLE_OPTIONS, ROLE_STYLE, ROLES_WITH_HEIGHT } from './layerRoles';

export interface LayerTableProps {
  layers: readonly ImportLayer[];
  /** Layers hidden in the preview (view only, not saved). */
  hidden: ReadonlySet<string>;
  onToggle: (name: string) => void;
  /** Saves one layer's change; absent for people who may only read. */
  onChange?: (patch: LayerPatch) => void;
  /** The layer whose change is being saved. */
  savingLayer?: string | null;
}

/** The drawing's layers: role, height, entity count, colour, and whether the preview shows them. */
export function LayerTable({ layers, hidden, onToggle, onChange, savingLayer }: LayerTableProps) {
  return (
    <div className="overflow-x-auto rounded-control border border-rule bg-paper-raised">
      <table aria-label="Layers" className="w-full border-collapse text-sm">
        <thead>
          <tr className="border-b border-rule-strong bg-paper-sunk text-left text-xs font-bold tracking-wide text-ink-muted uppercase">
            <th scope="col" className="px-2 py-2">Shown · layer</th>
            <th scope="col" className="px-2 py-2">Role</th>
            <th scope="col" className="px-2 py-2">Height, mm</th>
            <th scope="col" className="px-2 py-2 text-right">Entities</th>
          </tr>
        </thead>
        <tbody>
          {layers.map((layer) => (
            <LayerRow
              key={layer.name}
              layer={layer}
              shown={!hidden.has(layer.name)}
              onToggle={() => onToggle(layer.name)}
              onChange={onChange}
              saving={savingLayer === layer.name}
            />
          ))}
        </tbody>
      </table>
    </div>
  );
}

function LayerRow({
  layer,
  shown,
  onToggle,
  onChange,
  saving,
}: {
  layer: ImportLayer;
  shown: boolean;
  onToggle: () => void;
  onChange?: (patch: LayerPatch) => void;
  saving: boolean;
}) {
  const [height, setHeight] = useState(layer.height == null ? '' : String(layer.height));
  const [heightError, setHeightError] = useState<string | null>(null);
  // A saved height (or another's change) replaces what the box holds.
  const [shownHeight, setShownHeight] = useState(layer.height);
  if (layer.height !== shownHeight) {
    setShownHeight(layer.height);
    setHeight(layer.height == null ? '' : String(layer.height));
    setHeightError(null);
  }

  function commitHeight() {
    if (!onChange) return;
    const text = height.trim();
    const value = text === '' ? null : Number(text.replace(',', '.'));
    const parsed = LayerPatchSchema.safeParse({ name: layer.name, height: value });
    if (!parsed.success || (value !== null && Number.isNaN(value))) {
      setHeightError(parsed.success ? 'Enter a height in mm' : issueSentence(parsed.error.issues[0]));
      return;
    }
    setHeightError(null);
    if (value !== layer.height) onChange({ name: layer.name, height: value });
  }

  const roleStyle = ROLE_STYLE[layer.role];
  const withHeight = ROLES_WITH_HEIGHT.has(layer.role);
  return (
    <tr className={cn('border-b border-rule last:border-b-0', !shown && 'text-ink-faint')} aria-busy={saving || undefined}>
      <td className="px-2 py-1.5">
        <span className="inline-flex items-center gap-2">
          <input
            type="checkbox"
            checked={shown}
            onChange={onToggle}
            aria-label={`Show layer ${layer.name}`}
            className="size-4 shrink-0 accent-accent"
          />
          <span
            aria-hidden
            title={`Colour in the drawing: ${layer.color}`}
            className="inline-block size-3.5 shrink-0 rounded-sm border border-rule-strong"
            style={{ backgroundColor: layer.color }}
          />
          <span className="font-mono text-xs font-bold [overflow-wrap:anywhere]">{layer.name}</span>
        </span>
      </td>
      <td className="px-2 py-1.5">
        <span className="inline-flex items-center gap-2">
          <span aria-hidden className="inline-block h-0.5 w-4 shrink-0" style={{ backgroundColor: roleStyle.stroke }} />
          {onChange ? (
            <select
              aria-label={`Role of layer ${layer.name}`}
              value={layer.role}
              disabled={saving}
              onChange={(e) => onChange({ name: layer.name, role: e.target.value as LayerRole })}
              className="h-8 rounded-control border border-rule-strong bg-paper-raised px-2 text-sm"
            >
              {ROLE_OPTIONS.map((o) => (
                <option key={o.role} value={o.role} title={o.hint}>
                  {o.label}
                </option>
              ))}
            </select>
          ) : (
            <span title={ROLE_LABEL[layer.role].hint}>{ROLE_LABEL[layer.role].label}</span>
          )}
        </span>
      </td>
      <td className="px-2 py-1.5">
        {!withHeight ? (
          <span className="text-ink-faint">—</span>
        ) : onChange ? (
          <div className="flex flex-col">
            <input
              type="text"
              inputMode="decimal"
              aria-label={`Height of layer ${layer.name} in mm`}
              aria-invalid={heightError ? true : undefined}
              placeholder="full height"
              value={height}
              disabled={saving}
              onChange={(e) => setHeight(e.target.value)}
              onBlur={commitHeight}
              onKeyDown={(e) => {
                if (e.key === 'Enter') commitHeight();
              }}
              className={cn(
                'h-8 w-24 rounded-control border bg-paper-raised px-2 text-sm tabular-nums placeholder:text-ink-faint',
                heightError ? 'border-finding-critical' : 'border-rule-strong',
              )}
            />
            {heightError && (
              <span role="alert" className="mt-0.5 text-xs font-bold text-finding-critical">
                {heightError}
              </span>
            )}
          </div>
        ) : (
          <span className="tabular-nums">{layer.height == null ? 'full height' : layer.height}</span>
        )}
      </td>
      <td className="px-2 py-1.5 text-right tabular-nums">{layer.entityCount}</td>
    </tr>
  );
}
