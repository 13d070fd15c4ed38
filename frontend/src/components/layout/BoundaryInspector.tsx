import { useEffect, useRef, useState } from 'react';
import type { LayoutContent, Boundary } from '@shared/schemas/layout';
import { parseNumber } from '../../editor/armForm';
import { removeBoundary, updateBoundary } from '../../editor/layoutEdits';
import { Button } from '../Button';
import { TextField } from '../Field';
import { MeshFields, SafeguardFields } from './SafeguardFields';

const KIND_TEXT: Record<Boundary['kind'], string> = {
  fence: 'Guard fence',
  keepout: 'Keep-out',
  operator: 'Operator area (people work here)',
  opening: 'Access opening',
};

export interface BoundaryInspectorProps {
  boundary: Boundary;
  content: LayoutContent;
  readOnly: boolean;
  /** Puts the cursor in the height field (right after a fence is drawn). */
  focusHeight?: boolean;
  onEdit(next: LayoutContent, label: string): void;
  onDeselect(): void;
}

/** The selected boundary: kind, label, a fence's height and mesh, an opening's safeguard; delete. Vertices are dragged on the plan. */
export function BoundaryInspector({ boundary, content, readOnly, focusHeight, onEdit, onDeselect }: BoundaryInspectorProps) {
  const [label, setLabel] = useState(boundary.label);
  const [height, setHeight] = useState(boundary.height !== undefined ? String(boundary.height) : '');
  const [error, setError] = useState<string | undefined>();
  const heightRef = useRef<HTMLInputElement>(null);
  // An edit, a drag or an undo changes the boundary under the form: show its new values.
  const [shownBoundary, setShownBoundary] = useState(boundary);
  if (boundary !== shownBoundary) {
    setShownBoundary(boundary);
    setLabel(boundary.label);
    setHeight(boundary.height !== undefined ? String(boundary.height) : '');
    setError(undefined);
  }
  useEffect(() => {
    if (focusHeight) heightRef.current?.select();
  }, [focusHeight, boundary.id]);

  function applyLabel() {
    const t = label.trim();
    if (t.length > 60) return;
    if (t !== boundary.label) onEdit(updateBoundary(content, boundary.id, { label: t }), `Rename ${boundary.id}`);
  }
  function applyHeight() {
    const h = parseNumber(height);
    if (h === null || h <= 0) {
      setError('Give the fence height above the floor in mm (more than 0)');
      return;
    }
    setError(undefined);
    if (h !== boundary.height) onEdit(updateBoundary(content, boundary.id, { height: h }), `Set height of ${boundary.id}`);
  }
  const fence = boundary.kind === 'opening' ? content.boundaries.find((z) => z.id === boundary.fenceId) : null;

  return (
    <form
      aria-label={`Boundary ${boundary.id}`}
      className="flex flex-col gap-3"
      noValidate
      onSubmit={(e) => {
        e.preventDefault();
        applyLabel();
        if (boundary.kind === 'fence') applyHeight();
      }}
    >
      <div className="flex items-baseline gap-2">
        <h2 className="text-sm font-bold">
          {boundary.id} · {KIND_TEXT[boundary.kind]}
        </h2>
        <span className="text-xs text-ink-muted">
          {boundary.points.length} points{fence ? ` · in fence ${fence.id}` : ''}
        </span>
      </div>
      <TextField label="Label" value={label} readOnly={readOnly} maxLength={60} onChange={(e) => setLabel(e.target.value)} onBlur={() => !readOnly && applyLabel()} />
      {boundary.kind === 'fence' && (
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
      {boundary.kind === 'fence' && <MeshFields boundary={boundary} content={content} readOnly={readOnly} onEdit={onEdit} />}
      {boundary.kind === 'opening' && <SafeguardFields boundary={boundary} content={content} readOnly={readOnly} onEdit={onEdit} />}
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
                onEdit(removeBoundary(content, boundary.id), `Remove ${boundary.id}`);
                onDeselect();
              }}
            >
              {boundary.kind === 'fence' && content.boundaries.some((z) => z.fenceId === boundary.id) ? 'Remove fence and its openings' : 'Remove boundary'}
            </Button>
          </div>
        </>
      )}
    </form>
  );
}
