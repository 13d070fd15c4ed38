import { useEffect, useEffectEvent, useMemo, type ReactNode } from 'react';
import { useForm, useWatch, type FieldValues, type Path } from 'react-hook-form';
import { labelledResolver } from '../../lib/labelledResolver';
import { applyServerErrors } from '../../lib/serverErrors';
import { Button } from '../Button';
import { TextField } from '../Field';
import { ErrorNotice } from '../Notice';
import { axisKinematicDeg } from '@shared/kinematics';
import { ArticulatedFields } from './ArticulatedFields';
import { ChainFields } from './ChainFields';
import { FourBarDiagram } from './FourBarDiagram';
import { LinkageFields } from './LinkageFields';
import { ScaraFields } from './ScaraFields';
import type { ArmModelFormValues } from './familyDefaults';
import { ArmModelInput, FAMILY_LABELS } from './modelCore';
import { PosePanel } from './PosePanel';
import { ProfilePlot } from './ProfilePlot';
import { LinkSizeFields } from './LinkSizeFields';
import { StoppingFields } from './StoppingFields';
import { useLiveProfile } from './useLiveProfile';
import { usePose } from './usePose';

/** Which point the side profile traces, per family (the pose drawing ends at the tool point). */
const PROFILE_POINT: Record<string, string> = {
  scara: 'The profile is that of the flange over the stroke; the tool point hangs the tool length below it.',
  articulated: 'The profile is that of the wrist centre; the tool point hangs the tool length below it.',
  linkage: 'The profile is that of the level flange; the tool point hangs the tool length below it.',
  chain: 'The profile is that of the tool point over all joints but J1.',
};

/** Every dot path of a value (objects and arrays), for placing server field errors on the form. */
export function valuePaths(value: unknown, prefix = ''): string[] {
  if (value === null || typeof value !== 'object') return prefix ? [prefix] : [];
  const entries = Array.isArray(value) ? value.map((v, i) => [String(i), v] as const) : Object.entries(value);
  const out = prefix ? [prefix] : [];
  for (const [k, v] of entries) out.push(...valuePaths(v, prefix ? `${prefix}.${k}` : k));
  return out;
}

export interface ArmModelEditorProps {
  initial: ArmModelFormValues;
  /** Shown, not editable (built-in models, roles that may not write). */
  readOnly: boolean;
  submitLabel: string;
  /** Sends the checked values; the form then takes them as its new clean state. Field errors of a rejection land on their fields. */
  onSubmit?: (values: ArmModelInput) => Promise<unknown>;
  /** Called on the first edit after a save. */
  onChange?: () => void;
  onCancel?: () => void;
  /** Controls shown beside the save button (delete …). */
  actions?: ReactNode;
}

/**
 * The arm model form (react-hook-form, checked with the same schema the server uses) beside the
 * side reach profile that follows the typing and a pose panel drawing the arm in that profile.
 */
export function ArmModelEditor({ initial, readOnly, submitLabel, onSubmit, onChange, onCancel, actions }: ArmModelEditorProps) {
  const form = useForm<ArmModelFormValues, unknown, ArmModelInput>({
    resolver: labelledResolver(ArmModelInput),
    defaultValues: initial,
    mode: 'onChange',
  });
  const { register, control, handleSubmit, setError, setValue, getValues, formState } = form;
  const { errors, isSubmitting, isDirty } = formState;
  const params = useWatch({ control, name: 'params' });
  const family = (params as { family?: string } | undefined)?.family ?? initial.params.family;
  const live = useLiveProfile(params);
  // Told when the form turns dirty, not when the parent passes a new callback.
  const onFirstEdit = useEffectEvent(() => onChange?.());
  useEffect(() => {
    if (isDirty) onFirstEdit();
  }, [isDirty]);
  const pose = usePose(live.params);
  const profileView = useMemo(
    () =>
      live.profile
        ? {
            polygons: live.profile.polygons,
            maxReach: live.profile.maxReach,
            minReach: live.profile.minReach,
            toleranceMm: live.profile.toleranceMm,
            method: live.profile.method,
            envelope: live.envelope?.polygons ?? null,
            envelopeToleranceMm: live.envelope?.toleranceMm,
          }
        : null,
    [live.profile, live.envelope],
  );

  const submit = handleSubmit(async (values) => {
    if (!onSubmit) return;
    try {
      await onSubmit(values);
      form.reset(values as ArmModelFormValues);
    } catch (error) {
      applyServerErrors(error, setError, valuePaths(values) as Array<Path<FieldValues>> as never);
    }
  });

  return (
    <div className="grid gap-8 xl:grid-cols-[minmax(0,1.15fr)_minmax(0,1fr)]">
      <form onSubmit={(e) => void submit(e)} noValidate className="flex min-w-0 flex-col gap-4" aria-label="Arm model">
        {errors.root?.server?.message && <ErrorNotice message={errors.root.server.message} />}
        <fieldset disabled={readOnly} className="flex min-w-0 flex-col gap-4">
          <div className="grid grid-cols-[minmax(0,2fr)_minmax(0,1fr)] gap-4">
            <TextField label="Model name" autoComplete="off" error={errors.name?.message} {...register('name')} />
            <div className="flex flex-col gap-1">
              <span className="text-xs font-bold tracking-wide text-ink-muted uppercase">Kinematic family</span>
              <span className="flex h-9 items-center text-sm font-bold">{FAMILY_LABELS[family] ?? family}</span>
            </div>
          </div>
          {family === 'scara' && <ScaraFields register={register} errors={errors} />}
          {family === 'articulated' && <ArticulatedFields register={register} errors={errors} />}
          {family === 'linkage' && <LinkageFields control={control} register={register} setValue={setValue} getValues={getValues} errors={errors} readOnly={readOnly} />}
          {family === 'chain' && <ChainFields control={control} register={register} errors={errors} readOnly={readOnly} />}
          <LinkSizeFields family={family} register={register} errors={errors} />
          <StoppingFields family={family} register={register} errors={errors} />
        </fieldset>
        {!readOnly && onSubmit && (
          <div className="flex items-center justify-end gap-2 border-t border-rule pt-4">
            {actions}
            <span className="flex-1" />
            {onCancel && <Button onClick={onCancel}>Cancel</Button>}
            <Button type="submit" variant="primary" busy={isSubmitting} disabled={!isDirty && submitLabel !== 'Create model'}>
              {submitLabel}
            </Button>
          </div>
        )}
        {readOnly && actions && <div className="flex items-center gap-2 border-t border-rule pt-4">{actions}</div>}
      </form>

      <div className="flex min-w-0 flex-col gap-6 xl:sticky xl:top-4 xl:self-start">
        <ProfilePlot profile={profileView} pose={pose.view} stale={live.stale} note={PROFILE_POINT[family]} />
        {live.failure && <ErrorNotice title="The profile could not be computed" message={live.failure} />}
        <PosePanel pose={pose} />
        {live.params?.family === 'linkage' && live.params.fourBar && pose.joints.length === 3 && (
          <FourBarDiagram
            fourBar={live.params.fourBar}
            crankDeg={
              axisKinematicDeg(live.params.axes[2], pose.joints[2]) - axisKinematicDeg(live.params.axes[1], pose.joints[1]) - (live.params.fourBar.groundAngle ?? 0)
            }
          />
        )}
        <p className="border-l-4 border-finding-warning pl-3 text-xs text-ink-muted">
          Reach drawn from nominal kinematics is a planning estimate. The whole-arm outline grows each link by the link sizes
          entered; cables, dress pack and the base are not in it. It does not replace a risk assessment (ISO 12100), the
          robot-system safety requirements (ISO 10218-2) or the arm maker's stopping data; safeguarding is designed and validated
          by a competent person under local codes and regulations.
        </p>
      </div>
    </div>
  );
}
