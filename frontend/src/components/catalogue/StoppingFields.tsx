import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import type { ArmModelFormValues } from './familyDefaults';
import { FieldGroup, NumberField } from './formFields';

/** Tooling, payload and stopping data every family carries (all optional). */
export function StoppingFields({ register, errors }: { register: UseFormRegister<ArmModelFormValues>; errors: FieldErrors<ArmModelFormValues> }) {
  const f = (path: string, label: string, unit: string, hint?: string) => (
    <NumberField register={register} errors={errors} path={path as never} label={label} unit={unit} hint={hint} />
  );
  return (
    <FieldGroup
      title="Tooling, payload and stopping"
      lead="Stopping data comes from the arm maker's documentation for the real arm; leave a field empty when it is not known."
    >
      <div className="grid grid-cols-3 gap-3">
        {f('params.toolLength', 'Tool length', 'mm', 'Reaches beyond the tool point')}
        {f('params.payloadRadius', 'Payload radius', 'mm', 'Grows maximum space')}
        {f('params.payloadKg', 'Payload', 'kg')}
        {f('params.stopTimeS', 'Stop time', 's')}
        {f('params.stopDistanceMm', 'Stop distance', 'mm')}
        {f('params.maxSpeedMmS', 'Max tool speed', 'mm/s')}
      </div>
    </FieldGroup>
  );
}
