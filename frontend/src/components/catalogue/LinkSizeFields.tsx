import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import { LINK_SIZE_DEFAULTS } from '@shared/kinematics';
import type { ArmModelFormValues } from './familyDefaults';
import { FieldGroup, NumberField } from './formFields';

/** Label and hint of each link-size field, per family, in the order shown. */
const FIELDS: Record<string, Array<{ key: string; label: string; hint: string }>> = {
  scara: [
    { key: 'innerLinkRadius', label: 'Inner link radius', hint: 'Half-width, J1 to J2' },
    { key: 'outerLinkRadius', label: 'Outer link radius', hint: 'Half-width, J2 to the flange' },
    { key: 'toolRadius', label: 'Tool radius', hint: 'Round the quill and tool' },
  ],
  articulated: [
    { key: 'upperArmRadius', label: 'Upper arm radius', hint: 'Half-width, J2 to J3' },
    { key: 'forearmRadius', label: 'Forearm radius', hint: 'Half-width, J3 to the wrist' },
    { key: 'toolRadius', label: 'Tool radius', hint: 'Round the tool, which may tilt' },
  ],
  linkage: [
    { key: 'upperArmRadius', label: 'Upper arm radius', hint: 'Half-width, J2 to J3' },
    { key: 'forearmRadius', label: 'Forearm radius', hint: 'Half-width, J3 to the flange' },
    { key: 'toolRadius', label: 'Tool radius', hint: 'Round the hanging tool' },
    { key: 'rearLength', label: 'Rear length', hint: 'Counterweight side behind J2 and J3' },
    { key: 'rearRadius', label: 'Rear radius', hint: 'Half-width of crank, coupler and rear parts' },
  ],
  chain: [
    { key: 'linkRadius', label: 'Link radius', hint: 'Half-width of every link' },
    { key: 'toolRadius', label: 'Tool radius', hint: 'Last joint to the tool point' },
  ],
};

/** The link sizes of a family: optional half-widths that grow each link into the whole-arm envelope. */
export function LinkSizeFields({ family, register, errors }: { family: string; register: UseFormRegister<ArmModelFormValues>; errors: FieldErrors<ArmModelFormValues> }) {
  const fields = FIELDS[family];
  if (!fields) return null;
  const defaults = LINK_SIZE_DEFAULTS[family as keyof typeof LINK_SIZE_DEFAULTS] as Record<string, number>;
  return (
    <FieldGroup
      title="Link sizes"
      lead="Half-widths of the moving links, from the arm maker's drawings where you have them; an empty field uses the default shown. They grow maximum and restricted space."
    >
      <div className="grid grid-cols-3 gap-3">
        {fields.map((f) => (
          <NumberField
            key={`${family}-${f.key}`}
            register={register}
            errors={errors}
            path={`params.linkSizes.${f.key}` as never}
            label={f.label}
            unit="mm"
            hint={`${f.hint}; default ${defaults[f.key]} mm`}
          />
        ))}
      </div>
    </FieldGroup>
  );
}
