import { useWatch, type Control, type FieldErrors, type UseFormGetValues, type UseFormRegister, type UseFormSetValue } from 'react-hook-form';
import { ArmGeometryFields } from './ArticulatedFields';
import { AxesTable } from './AxesTable';
import { DEFAULT_FOUR_BAR, type ArmModelFormValues } from './familyDefaults';
import { errorAt, FieldGroup, NumberField } from './formFields';

interface Props {
  control: Control<ArmModelFormValues>;
  register: UseFormRegister<ArmModelFormValues>;
  setValue: UseFormSetValue<ArmModelFormValues>;
  getValues: UseFormGetValues<ArmModelFormValues>;
  errors: FieldErrors<ArmModelFormValues>;
  readOnly: boolean;
}

const SELECT = 'h-9 w-full rounded-control border border-rule-strong bg-paper-raised px-2 text-sm disabled:bg-paper-sunk';

/**
 * Fields of a linkage-driven arm: the arm geometry, the four-bar that drives the forearm from the
 * J3 motor at the shoulder (or an exact parallelogram), the coupled elbow-angle limit, the level
 * flange's offsets and the motor axes.
 */
export function LinkageFields({ control, register, setValue, getValues, errors, readOnly }: Props) {
  const fourBar = useWatch({ control, name: 'params.fourBar' as never }) as unknown;
  const parallelogram = fourBar === null;
  const n = (path: string, label: string, unit: string, hint?: string) => (
    <NumberField register={register} errors={errors} path={path as never} label={label} unit={unit} hint={hint} />
  );
  const fourBarError = errorAt(errors, 'params.fourBar');
  return (
    <>
      <ArmGeometryFields register={register} errors={errors} />
      <FieldGroup
        title="Forearm drive"
        lead="The J3 motor sits at the shoulder and turns the crank; the coupler drives the rocker, which is rigid with the forearm. The ground link is the upper arm itself."
      >
        <label className="flex items-center gap-2 text-sm">
          <input
            type="checkbox"
            checked={parallelogram}
            disabled={readOnly}
            onChange={(e) => setValue('params.fourBar' as never, (e.target.checked ? null : DEFAULT_FOUR_BAR(Number(getValues('params.upperArm' as never)))) as never, { shouldDirty: true, shouldValidate: true })}
          />
          Exact parallelogram (the forearm keeps the crank’s angle)
        </label>
        {!parallelogram && (
          <div className="grid grid-cols-3 gap-3">
            {n('params.fourBar.ground', 'Ground', 'mm', 'Equals the upper arm')}
            {n('params.fourBar.crank', 'Crank', 'mm', 'On the J2 axis')}
            {n('params.fourBar.coupler', 'Coupler', 'mm')}
            {n('params.fourBar.rocker', 'Rocker', 'mm', 'On the J3 axis')}
            {n('params.fourBar.rockerToForearm', 'Rocker to forearm', '°', 'Fixed angle of the lever')}
            <label className="flex flex-col gap-1">
              <span className="text-xs font-bold tracking-wide text-ink-muted uppercase">Assembly branch</span>
              <select className={SELECT} {...register('params.fourBar.branch' as never)}>
                <option value="open">open</option>
                <option value="crossed">crossed</option>
              </select>
            </label>
          </div>
        )}
        {fourBarError && (
          <p role="alert" className="text-xs font-bold text-finding-critical">
            {fourBarError}
          </p>
        )}
      </FieldGroup>
      <FieldGroup title="Elbow angle and flange" lead="The interior angle between upper arm and forearm: 180° stretched, 0° folded back. The flange stays level at fixed offsets from the wrist.">
        <div className="grid grid-cols-2 gap-3">
          {n('params.interiorAngle.min', 'Elbow angle min', '°')}
          {n('params.interiorAngle.max', 'Elbow angle max', '°')}
          {n('params.flangeOffset.horizontal', 'Flange offset out', 'mm')}
          {n('params.flangeOffset.vertical', 'Flange offset up', 'mm')}
        </div>
        {errorAt(errors, 'params.interiorAngle') && (
          <p role="alert" className="text-xs font-bold text-finding-critical">
            {errorAt(errors, 'params.interiorAngle')}
          </p>
        )}
      </FieldGroup>
      <AxesTable register={register} errors={errors} labels={['J1', 'J2 motor', 'J3 motor']} lead="J2 motor turns the upper arm; J3 motor turns the crank (absolute angle). Controller degrees." />
    </>
  );
}
