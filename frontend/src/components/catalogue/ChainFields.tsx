import { useFieldArray, type Control, type FieldErrors, type UseFormRegister } from 'react-hook-form';
import { Button } from '../Button';
import { errorAt, FieldGroup, NumberField } from './formFields';
import type { ArmModelFormValues } from './familyDefaults';

interface Props {
  control: Control<ArmModelFormValues>;
  register: UseFormRegister<ArmModelFormValues>;
  errors: FieldErrors<ArmModelFormValues>;
  readOnly: boolean;
}

const SELECT = 'h-8 w-full rounded-control border border-rule-strong bg-paper-raised px-1 text-sm disabled:bg-paper-sunk';

/** Fields of a DH chain: the convention, one table row per joint (DH row, limits, zero offset, direction), the tool point. */
export function ChainFields({ control, register, errors, readOnly }: Props) {
  const joints = useFieldArray({ control, name: 'params.joints' as never });
  const rowsError = errorAt(errors, 'params.joints') ?? errorAt(errors, 'params.joints.root');
  return (
    <>
      <FieldGroup
        title="DH table"
        lead="One row per joint. Lengths mm, angles degrees. Limits, zero offset and direction are in controller units: kinematic value = direction × controller value + zero offset."
      >
        <label className="flex max-w-xs flex-col gap-1">
          <span className="text-xs font-bold tracking-wide text-ink-muted uppercase">Convention</span>
          <select className={SELECT} {...register('params.convention' as never)}>
            <option value="standard">Standard DH (Rz θ · Tz d · Tx a · Rx α)</option>
            <option value="modified">Modified DH (Rx α · Tx a · Rz θ · Tz d, previous link)</option>
          </select>
        </label>
        <div className="overflow-x-auto">
          <table className="w-full border-collapse text-sm" aria-label="Joints">
            <thead>
              <tr className="text-left text-xs text-ink-muted uppercase">
                <th className="px-1 py-1">Joint</th>
                <th className="px-1 py-1">Type</th>
                <th className="px-1 py-1">a mm</th>
                <th className="px-1 py-1">α °</th>
                <th className="px-1 py-1">d mm</th>
                <th className="px-1 py-1">θ °</th>
                <th className="px-1 py-1">Min</th>
                <th className="px-1 py-1">Max</th>
                <th className="px-1 py-1" title="Zero offset">Zero</th>
                <th className="px-1 py-1" title="Direction">Dir.</th>
                <th className="px-1 py-1">
                  <span className="sr-only">Remove</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {joints.fields.map((field, i) => {
                const p = (k: string) => `params.joints.${i}.${k}` as never;
                const J = `J${i + 1}`;
                return (
                  <tr key={field.id} className="align-top">
                    <th scope="row" className="px-1 py-1.5 text-left">
                      {J}
                    </th>
                    <td className="min-w-[4.75rem] px-0.5 py-1">
                      <select aria-label={`${J} type`} className={SELECT} {...register(p('type'))}>
                        <option value="revolute">rev.</option>
                        <option value="prismatic">prism.</option>
                      </select>
                    </td>
                    {(['a', 'alpha', 'd', 'theta', 'min', 'max', 'zeroOffset'] as const).map((k) => (
                      <td key={k} className="min-w-[3.75rem] px-0.5 py-1">
                        <NumberField compact register={register} errors={errors} path={p(k)} label={`${J} ${k === 'zeroOffset' ? 'zero offset' : k}`} />
                      </td>
                    ))}
                    <td className="px-1 py-1">
                      <select aria-label={`${J} direction`} className={SELECT} {...register(p('direction'), { setValueAs: (v) => (v === '' || v == null ? undefined : Number(v)) })}>
                        <option value="1">+1</option>
                        <option value="-1">−1</option>
                      </select>
                    </td>
                    <td className="px-1 py-1">
                      {!readOnly && (
                        <Button size="sm" variant="quiet" aria-label={`Remove ${J}`} onClick={() => joints.remove(i)} disabled={joints.fields.length <= 1}>
                          ✕
                        </Button>
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
        {rowsError && (
          <p role="alert" className="text-xs font-bold text-finding-critical">
            {rowsError}
          </p>
        )}
        {!readOnly && (
          <div>
            <Button
              size="sm"
              disabled={joints.fields.length >= 8}
              onClick={() => joints.append({ type: 'revolute', a: 0, alpha: 0, d: 0, theta: 0, min: -180, max: 180, zeroOffset: 0, direction: 1 } as never)}
            >
              Add joint
            </Button>
          </div>
        )}
      </FieldGroup>
      <FieldGroup title="Tool point" lead="Where the tool point sits in the last joint's frame, mm.">
        <div className="grid grid-cols-3 gap-3">
          {(['x', 'y', 'z'] as const).map((k) => (
            <NumberField key={k} register={register} errors={errors} path={`params.tool.${k}` as never} label={`Offset ${k}`} unit="mm" />
          ))}
        </div>
      </FieldGroup>
    </>
  );
}
