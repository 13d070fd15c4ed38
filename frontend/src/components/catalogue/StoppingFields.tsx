import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import type { ArmModelFormValues } from './familyDefaults';
import { FieldGroup, NumberField } from './formFields';

/** What the tool length is, per family: below the flange or wrist centre for most, beyond the tool point for a DH chain. */
const TOOL_LENGTH_HINT: Record<string, string> = {
  scara: 'Flange straight down to the tool point',
  articulated: 'Wrist centre straight down to the tool point',
  linkage: 'Level flange straight down to the tool point',
  chain: 'Tooling beyond the tool point (e.g. a held part); grows the spaces only',
};

/** Tooling, payload and stopping data every family carries (all optional). */
export function StoppingFields({ family, register, errors }: { family: string; register: UseFormRegister<ArmModelFormValues>; errors: FieldErrors<ArmModelFormValues> }) {
  const f = (path: string, label: string, unit: string, hint?: string) => (
    <NumberField register={register} errors={errors} path={path as never} label={label} unit={unit} hint={hint} />
  );
  return (
    <FieldGroup
      title="Tooling, payload and stopping"
      lead="Stopping data comes from the arm maker's measured values for the real arm; leave a field empty when it is not known. Safeguard distances are computed only from values given here."
    >
      <div className="grid grid-cols-3 gap-3">
        {f('params.toolLength', 'Tool length', 'mm', TOOL_LENGTH_HINT[family])}
        {f('params.payloadRadius', 'Payload radius', 'mm', 'Grows maximum space')}
        {f('params.payloadKg', 'Payload', 'kg')}
        {f('params.stopTimeS', 'Stop time, category 0', 's', 'Power removed at once')}
        {f('params.stopTimeCat1S', 'Stop time, category 1', 's', 'Controlled stop, then power removed')}
        {f('params.stopDistanceMm', 'Stop distance', 'mm')}
        {f('params.maxSpeedMmS', 'Max tool speed', 'mm/s')}
      </div>
    </FieldGroup>
  );
}
