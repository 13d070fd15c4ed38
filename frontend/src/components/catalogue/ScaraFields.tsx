import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import { AxesTable } from './AxesTable';
import type { ArmModelFormValues } from './familyDefaults';
import { FieldGroup, NumberField } from './formFields';

interface Props {
  register: UseFormRegister<ArmModelFormValues>;
  errors: FieldErrors<ArmModelFormValues>;
}

/** Fields of a SCARA: the two links turning about vertical axes, the vertical stroke, J1/J2 axes. */
export function ScaraFields({ register, errors }: Props) {
  const f = (path: string, label: string, hint?: string) => <NumberField register={register} errors={errors} path={path as never} label={label} unit="mm" hint={hint} />;
  return (
    <>
      <FieldGroup title="Links and stroke" lead="J1 and J2 turn about vertical axes; the stroke sets the flange height above the base plate.">
        <div className="grid grid-cols-2 gap-3">
          {f('params.innerLink', 'Inner link', 'J1 axis to J2 axis')}
          {f('params.outerLink', 'Outer link', 'J2 axis to the quill')}
          {f('params.strokeMin', 'Stroke bottom', 'Lowest flange height')}
          {f('params.strokeMax', 'Stroke top', 'Highest flange height')}
        </div>
      </FieldGroup>
      <AxesTable register={register} errors={errors} labels={['J1', 'J2']} />
    </>
  );
}
