import { useState, type FormEvent } from 'react';
import type { ArmPlacement, LayoutContent } from '@shared/schemas/layout';
import { armFormValues, parseArmForm, type ArmField, type ArmFormErrors, type ArmFormValues } from '../../editor/armForm';
import { duplicateArm, normalizeYaw, removeArm, updateArm } from '../../editor/layoutEdits';
import { Button } from '../Button';
import { SelectField, TextField } from '../Field';

export interface ArmInspectorProps {
  arm: ArmPlacement;
  content: LayoutContent;
  armModels: Array<{ id: number; name: string; maxReach?: number | null }>;
  readOnly: boolean;
  onEdit(next: LayoutContent, label: string, mergeKey?: string | null): void;
  onSelectArm(id: string | null): void;
}

const FIELD_LABEL: Record<Exclude<ArmField, 'label'>, { label: string; unit: string; hint?: string }> = {
  x: { label: 'x (east)', unit: 'mm' },
  y: { label: 'y (north)', unit: 'mm' },
  yaw: { label: 'Yaw', unit: '°', hint: 'J1 zero, CCW from east' },
  mountHeight: { label: 'Mount height', unit: 'mm', hint: 'Base plate above floor' },
  j1Min: { label: 'J1 min', unit: '°' },
  j1Max: { label: 'J1 max', unit: '°' },
};

/** The selected arm's exact values: position, yaw, mount height, restricting J1 limits, label, model. */
export function ArmInspector({ arm, content, armModels, readOnly, onEdit, onSelectArm }: ArmInspectorProps) {
  const [values, setValues] = useState<ArmFormValues>(() => armFormValues(arm));
  const [errors, setErrors] = useState<ArmFormErrors>({});
  // A drag, a key nudge or an undo changes the arm under the form: show its new values (adjusted
  // while rendering, so the form never shows the old arm's values for a frame).
  const [shownArm, setShownArm] = useState(arm);
  if (arm !== shownArm) {
    setShownArm(arm);
    setValues(armFormValues(arm));
    setErrors({});
  }

  function apply(next: ArmFormValues = values) {
    const r = parseArmForm(arm, next);
    if (!r.ok) {
      setErrors(r.errors);
      return;
    }
    setErrors({});
    const patch = { ...r.patch, yaw: normalizeYaw(r.patch.yaw!) };
    const same = JSON.stringify(armFormValues({ ...arm, ...patch })) === JSON.stringify(armFormValues(arm)) && (patch.restrict === undefined) === (arm.restrict === undefined);
    if (same) return;
    onEdit(updateArm(content, arm.id, patch), `Edit ${arm.id}`);
  }

  function onSubmit(e: FormEvent) {
    e.preventDefault();
    apply();
  }

  const model = armModels.find((m) => m.id === arm.armModelId);
  const field = (name: Exclude<ArmField, 'label'>) => (
    <TextField
      key={name}
      label={`${FIELD_LABEL[name].label} (${FIELD_LABEL[name].unit})`}
      name={name}
      inputMode="decimal"
      value={values[name]}
      readOnly={readOnly}
      error={errors[name]}
      hint={FIELD_LABEL[name].hint}
      onChange={(e) => setValues((v) => ({ ...v, [name]: e.target.value }))}
      onBlur={() => !readOnly && apply()}
      className="tabular-nums"
    />
  );

  return (
    <form onSubmit={onSubmit} aria-label={`Arm ${arm.id}`} className="flex flex-col gap-2.5" noValidate>
      <div className="flex items-baseline gap-2">
        <h2 className="text-sm font-bold">Arm {arm.id}</h2>
        <span className="truncate text-xs text-ink-muted">
          {model ? model.name : `model ${arm.armModelId} (not in the catalogue)`}
          {model?.maxReach ? ` · reach ${Math.round(model.maxReach)} mm` : ''}
        </span>
      </div>
      <TextField
        label="Label"
        name="label"
        value={values.label}
        readOnly={readOnly}
        error={errors.label}
        placeholder="e.g. case packer"
        onChange={(e) => setValues((v) => ({ ...v, label: e.target.value }))}
        onBlur={() => !readOnly && apply()}
      />
      {!readOnly && (
        <SelectField
          label="Arm model"
          value={String(arm.armModelId)}
          onChange={(e) => onEdit(updateArm(content, arm.id, { armModelId: Number(e.target.value) }), `Change model of ${arm.id}`)}
        >
          {!model && <option value={arm.armModelId}>model {arm.armModelId}</option>}
          {armModels.map((m) => (
            <option key={m.id} value={m.id}>
              {m.name}
            </option>
          ))}
        </SelectField>
      )}
      <div className="grid grid-cols-2 gap-2.5">
        {field('x')}
        {field('y')}
        {field('yaw')}
        {field('mountHeight')}
      </div>
      <fieldset className="flex flex-col gap-2 rounded-control border border-rule p-2">
        <legend className="px-1 text-xs font-bold text-ink-muted" title="Mechanical stops or safety-rated soft limits on this arm; leave both empty for the model’s own limits">Restricting J1 limits (empty = the model’s own)</legend>
        <div className="grid grid-cols-2 gap-3">
          {field('j1Min')}
          {field('j1Max')}
        </div>
      </fieldset>
      {!readOnly && (
        <div className="flex flex-wrap gap-2">
          <button type="submit" className="sr-only">
            Apply
          </button>
          <Button
            size="sm"
            onClick={() => {
              const r = duplicateArm(content, arm.id);
              onEdit(r.content, `Duplicate ${arm.id}`);
              onSelectArm(r.id);
            }}
          >
            Duplicate
          </Button>
          <Button
            size="sm"
            variant="danger"
            onClick={() => {
              onEdit(removeArm(content, arm.id), `Remove ${arm.id}`);
              onSelectArm(null);
            }}
          >
            Remove arm
          </Button>
        </div>
      )}
    </form>
  );
}
