import { useState } from 'react';
import { MESH_SHAPE_NAMES, SAFEGUARD_DEVICE_NAMES, type LayoutContent, type Boundary } from '@shared/schemas/layout';
import { setBoundarySafeguarding } from '../../editor/layoutEdits';
import {
  DEVICE_LABEL,
  SAFEGUARD_FIELD_LABEL,
  parseMeshForm,
  parseSafeguardForm,
  safeguardFieldsFor,
  safeguardFormValues,
  type MeshShapeName,
  type SafeguardField,
  type SafeguardFormValues,
} from '../../editor/safeguardForm';
import { SelectField, TextField } from '../Field';

interface Props {
  boundary: Boundary;
  content: LayoutContent;
  readOnly: boolean;
  onEdit(next: LayoutContent, label: string): void;
}

const same = (a: unknown, b: unknown) => JSON.stringify(a ?? null) === JSON.stringify(b ?? null);

/**
 * An access opening's safeguard: the device, its response time, the stop category it triggers and
 * what the device's ISO 13855 distance needs. Applied when a field is left or a choice is made, once
 * every field it needs is filled in; the analysis then checks the separation distance.
 */
export function SafeguardFields({ boundary, content, readOnly, onEdit }: Props) {
  const [values, setValues] = useState<SafeguardFormValues>(() => safeguardFormValues(boundary));
  const [errors, setErrors] = useState<Partial<Record<SafeguardField, string>>>({});
  const [shown, setShown] = useState(boundary);
  if (boundary !== shown) {
    setShown(boundary);
    setValues(safeguardFormValues(boundary));
    setErrors({});
  }

  function apply(next: SafeguardFormValues, showErrors: boolean) {
    const r = parseSafeguardForm(next);
    if (!r.ok) {
      setErrors(showErrors ? r.errors : {});
      return;
    }
    setErrors({});
    if (!same(r.safeguard, boundary.safeguard)) {
      onEdit(setBoundarySafeguarding(content, boundary.id, { safeguard: r.safeguard }), r.safeguard ? `Set safeguard of ${boundary.id}` : `Remove safeguard of ${boundary.id}`);
    }
  }
  const set = (patch: Partial<SafeguardFormValues>, now = false) => {
    const next = { ...values, ...patch };
    setValues(next);
    if (now) apply(next, false);
  };
  const fields = safeguardFieldsFor(values.device, values.approach);
  const numberField = (field: 'responseTimeS' | 'resolutionMm' | 'beams' | 'heightMm', hint?: string) =>
    fields.includes(field) && (
      <TextField
        key={field}
        label={SAFEGUARD_FIELD_LABEL[field]}
        inputMode="decimal"
        value={values[field]}
        readOnly={readOnly}
        error={errors[field]}
        hint={hint}
        onChange={(e) => set({ [field]: e.target.value })}
        onBlur={() => !readOnly && apply(values, true)}
        onKeyDown={(e) => {
          if (e.key !== 'Enter' || readOnly) return;
          e.preventDefault();
          apply(values, true);
        }}
        className="tabular-nums"
      />
    );

  return (
    <fieldset className="flex flex-col gap-3 border-t border-rule pt-3" aria-label="Safeguard of the opening">
      <SelectField
        label={SAFEGUARD_FIELD_LABEL.device}
        value={values.device}
        disabled={readOnly}
        error={errors.device}
        hint={values.device ? undefined : 'The device that stops the arm when someone comes through the opening.'}
        onChange={(e) => set({ device: e.target.value as SafeguardFormValues['device'] }, true)}
      >
        <option value="">None</option>
        {SAFEGUARD_DEVICE_NAMES.map((d) => (
          <option key={d} value={d}>
            {DEVICE_LABEL[d]}
          </option>
        ))}
      </SelectField>
      {numberField('responseTimeS', "From the device's data sheet (with its safety controller).")}
      {fields.includes('stopCategory') && (
        <SelectField
          label={SAFEGUARD_FIELD_LABEL.stopCategory}
          value={values.stopCategory}
          disabled={readOnly}
          error={errors.stopCategory}
          hint="The arm model's stopping time for this category is used."
          onChange={(e) => set({ stopCategory: e.target.value as SafeguardFormValues['stopCategory'] }, true)}
        >
          <option value="">Choose…</option>
          <option value="0">0 — power removed at once</option>
          <option value="1">1 — controlled stop, then power removed</option>
        </SelectField>
      )}
      {numberField('resolutionMm', 'Detection capability d of the light curtain.')}
      {fields.includes('approach') && (
        <SelectField
          label={SAFEGUARD_FIELD_LABEL.approach}
          value={values.approach}
          disabled={readOnly}
          error={errors.approach}
          onChange={(e) => set({ approach: e.target.value as SafeguardFormValues['approach'] }, true)}
        >
          <option value="normal">Normal (vertical detection boundary)</option>
          <option value="parallel">Parallel (horizontal detection boundary)</option>
        </SelectField>
      )}
      {numberField('heightMm', 'Height of the horizontal detection boundary above the floor, at most 1 000 mm.')}
      {numberField('beams')}
      {values.device && (
        <p className="text-xs text-ink-muted">
          A planning check (ISO 13855): verify the distance with the maker's measured stopping data and the installed device.
        </p>
      )}
    </fieldset>
  );
}

/** A fence's mesh: the size e of its openings and their shape, for the ISO 13857 reach-through distance. */
export function MeshFields({ boundary, content, readOnly, onEdit }: Props) {
  const [size, setSize] = useState(boundary.meshMm !== undefined ? String(boundary.meshMm) : '');
  const [shape, setShape] = useState<MeshShapeName | ''>(boundary.meshShape ?? '');
  const [errors, setErrors] = useState<Partial<Record<'meshMm' | 'meshShape', string>>>({});
  const [shown, setShown] = useState(boundary);
  if (boundary !== shown) {
    setShown(boundary);
    setSize(boundary.meshMm !== undefined ? String(boundary.meshMm) : '');
    setShape(boundary.meshShape ?? '');
    setErrors({});
  }
  function apply(nextSize: string, nextShape: MeshShapeName | '', showErrors: boolean) {
    const r = parseMeshForm(nextSize, nextShape);
    if (!r.ok) {
      setErrors(showErrors ? r.errors : {});
      return;
    }
    setErrors({});
    const mesh = r.meshMm === null ? null : { meshMm: r.meshMm, meshShape: r.meshShape! };
    if (!same(mesh, boundary.meshMm === undefined ? null : { meshMm: boundary.meshMm, meshShape: boundary.meshShape })) {
      onEdit(setBoundarySafeguarding(content, boundary.id, { mesh }), mesh ? `Set mesh of ${boundary.id}` : `Remove mesh of ${boundary.id}`);
    }
  }
  return (
    <div className="grid grid-cols-2 gap-3">
      <TextField
        label="Mesh size (mm)"
        inputMode="decimal"
        value={size}
        readOnly={readOnly}
        error={errors.meshMm}
        hint="Slot width, square side or round diameter; empty for solid panels."
        onChange={(e) => setSize(e.target.value)}
        onBlur={() => !readOnly && apply(size, shape, true)}
        onKeyDown={(e) => {
          if (e.key !== 'Enter' || readOnly) return;
          e.preventDefault();
          apply(size, shape, true);
        }}
        className="tabular-nums"
      />
      <SelectField
        label="Mesh shape"
        value={shape}
        disabled={readOnly}
        error={errors.meshShape}
        onChange={(e) => {
          const s = e.target.value as MeshShapeName | '';
          setShape(s);
          apply(size, s, size.trim() !== '');
        }}
      >
        <option value="">—</option>
        {MESH_SHAPE_NAMES.map((s) => (
          <option key={s} value={s}>
            {s[0].toUpperCase() + s.slice(1)}
          </option>
        ))}
      </SelectField>
    </div>
  );
}
