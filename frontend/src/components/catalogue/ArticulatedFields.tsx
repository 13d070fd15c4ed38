import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import { AxesTable } from './AxesTable';
import type { ArmModelFormValues } from './familyDefaults';
import { FieldGroup, NumberField } from './formFields';

interface Props {
  register: UseFormRegister<ArmModelFormValues>;
  errors: FieldErrors<ArmModelFormValues>;
}

/** Shoulder, upper arm, forearm and elbow offset: the arm-plane geometry the articulated and linkage families share. */
export function ArmGeometryFields({ register, errors }: Props) {
  const f = (path: string, label: string, hint?: string) => <NumberField register={register} errors={errors} path={path as never} label={label} unit="mm" hint={hint} />;
  return (
    <FieldGroup title="Arm geometry" lead="In the arm’s vertical plane; the wrist centre is the point the profile traces.">
      <div className="grid grid-cols-2 gap-3">
        {f('params.shoulderHeight', 'Shoulder height', 'J2 axis above the base plate')}
        {f('params.shoulderOffset', 'Shoulder offset', 'J1 axis to J2 axis, horizontal')}
        {f('params.upperArm', 'Upper arm', 'J2 axis to J3 axis')}
        {f('params.forearm', 'Forearm', 'J3 axis to the wrist centre')}
        {f('params.elbowOffset', 'Elbow offset', 'Perpendicular offset at J3')}
      </div>
    </FieldGroup>
  );
}

/** Fields of an articulated arm: geometry and the J1–J3 axes. */
export function ArticulatedFields({ register, errors }: Props) {
  return (
    <>
      <ArmGeometryFields register={register} errors={errors} />
      <AxesTable register={register} errors={errors} labels={['J1', 'J2', 'J3']} />
    </>
  );
}
