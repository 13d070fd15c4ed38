import { useEffect, useRef, useState } from 'react';
import type { LayoutContent, Zone } from '@shared/schemas/layout';
import { parseNumber } from '../../editor/armForm';
import { removeZone, updateZone } from '../../editor/layoutEdits';
import { Button } from '../Button';
import { TextField } from '../Field';
import { MeshFields, SafeguardFields } from './SafeguardFields';

const KIND_TEXT: Record<Zone['kind'], string> = {
  fence: 'Guard fence',
  keepout: 'Keep-out',
  operator: 'Operator area (people work here)',
  opening: 'Access opening',
};

export interface ZoneInspectorProps {
  zone: Zone;
  content: LayoutContent;
  readOnly: boolean;
  /** Puts the cursor in the height field (right after a fence is drawn). */
  focusHeight?: boolean;
  onEdit(next: LayoutContent, label: string): void;
  onDeselect(): void;
}

/** The selected zone: kind, label, a fence's height and mesh, an opening's safeguard; delete. Vertices are dragged on the plan. */
export function ZoneInspector({ zone, content, readOnly, focusHeight, onEdit, onDeselect }: ZoneInspectorProps) {
  const [label, setLabel] = useState(zone.label);
  const [height, setHeight] = useState(zone.height !== undefined ? String(zone.height) : '');
  const [error, setError] = useState<string | undefined>();
  const heightRef = useRef<HTMLInputElement>(null);
  // An edit, a drag or an undo changes the zone under the form: show its new values.
  const [shownZone, setShownZone] = useState(zone);
  if (zone !== shownZone) {
    setShownZone(zone);
    setLabel(zone.label);
    setHeight(zone.height !== undefined ? String(zone.height) : '');
    setError(undefined);
  }
  useEffect(() => {
    if (focusHeight) heightRef.current?.select();
  }, [focusHeight, zone.id]);

  function applyLabel() {
    const t = label.trim();
    if (t.length > 60) return;
    if (t !== zone.label) onEdit(updateZone(content, zone.id, { label: t }), `Rename ${zone.id}`);
  }
  function applyHeight() {
    const h = parseNumber(height);
    if (h === null || h <= 0) {
      setError('Give the fence height above the floor in mm (more than 0)');
      return;
    }
    setError(undefined);
    if (h !== zone.height) onEdit(updateZone(content, zone.id, { height: h }), `Set height of ${zone.id}`);
  }
  const fence = zone.kind === 'opening' ? content.zones.find((z) => z.id === zone.fenceId) : null;

  return (
    <form
      aria-label={`Zone ${zone.id}`}
      className="flex flex-col gap-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        applyLabel();
        if (zone.kind === 'fence') applyHeight();
      }}
    >
      <div className="flex items-baseline gap-2">
        <h2 className="text-sm font-bold">
          {zone.id} · {KIND_TEXT[zone.kind]}
        </h2>
        <span className="text-xs text-ink-muted">
          {zone.points.length} points{fence ? ` · in fence ${fence.id}` : ''}
        </span>
      </div>
      <TextField label="Label" value={label} readOnly={readOnly} maxLength={60} onChange={(e) => setLabel(e.target.value)} onBlur={() => !readOnly && applyLabel()} />
      {zone.kind === 'fence' && (
        <TextField
          ref={heightRef}
          label="Fence height (mm)"
          inputMode="decimal"
          value={height}
          readOnly={readOnly}
          error={error}
          hint="Top of the guard above the floor. Perimeter guards are at least 1 400 mm (ISO 10218-2); ISO 13857 may ask for more."
          onChange={(e) => setHeight(e.target.value)}
          onBlur={() => !readOnly && applyHeight()}
          className="tabular-nums"
        />
      )}
      {zone.kind === 'fence' && <MeshFields zone={zone} content={content} readOnly={readOnly} onEdit={onEdit} />}
      {zone.kind === 'opening' && <SafeguardFields zone={zone} content={content} readOnly={readOnly} onEdit={onEdit} />}
      {!readOnly && (
        <>
          <p className="text-xs text-ink-muted">Drag the square handles on the plan to move its corners.</p>
          <div className="flex gap-2">
            <button type="submit" className="sr-only">
              Apply
            </button>
            <Button
              size="sm"
              variant="danger"
              onClick={() => {
                onEdit(removeZone(content, zone.id), `Remove ${zone.id}`);
                onDeselect();
              }}
            >
              {zone.kind === 'fence' && content.zones.some((z) => z.fenceId === zone.id) ? 'Remove fence and its openings' : 'Remove zone'}
            </Button>
          </div>
        </>
      )}
    </form>
  );
}
