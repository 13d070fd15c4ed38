import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import type { ArmModelFormValues } from './familyDefaults';
import { errorAt, FieldGroup, NumberField } from './formFields';

const SELECT = 'h-8 w-full rounded-control border border-rule-strong bg-paper-raised px-1 text-sm disabled:bg-paper-sunk';

/**
 * The revolute axes of a scara / articulated / linkage model: limits, zero offset and direction in
 * controller degrees (kinematic angle = direction × controller angle + zero offset).
 */
export function AxesTable({
  register,
  errors,
  labels,
  lead,
}: {
  register: UseFormRegister<ArmModelFormValues>;
  errors: FieldErrors<ArmModelFormValues>;
  /** One label per axis ("J1", "J2 motor" …). */
  labels: readonly string[];
  lead?: string;
}) {
  const listError = errorAt(errors, 'params.axes') ?? errorAt(errors, 'params.axes.root');
  return (
    <FieldGroup
      title="Axes"
      lead={lead ?? 'Controller degrees, as the arm’s own display reads them. Kinematic angle = direction × controller angle + zero offset.'}
    >
      <table className="w-full max-w-2xl border-collapse text-sm" aria-label="Axes">
        <thead>
          <tr className="text-left text-xs text-ink-muted uppercase">
            <th className="px-1 py-1">Axis</th>
            <th className="px-1 py-1">Min °</th>
            <th className="px-1 py-1">Max °</th>
            <th className="px-1 py-1">Zero offset °</th>
            <th className="px-1 py-1">Direction</th>
          </tr>
        </thead>
        <tbody>
          {labels.map((label, i) => {
            const p = (k: string) => `params.axes.${i}.${k}` as never;
            return (
              <tr key={label} className="align-top">
                <th scope="row" className="px-1 py-1.5 text-left whitespace-nowrap">
                  {label}
                </th>
                <td className="px-1 py-1">
                  <NumberField compact register={register} errors={errors} path={p('min')} label={`${label} min`} />
                </td>
                <td className="px-1 py-1">
                  <NumberField compact register={register} errors={errors} path={p('max')} label={`${label} max`} />
                </td>
                <td className="px-1 py-1">
                  <NumberField compact register={register} errors={errors} path={p('zeroOffset')} label={`${label} zero offset`} />
                </td>
                <td className="px-1 py-1">
                  <select aria-label={`${label} direction`} className={SELECT} {...register(p('direction'), { setValueAs: (v) => (v === '' || v == null ? undefined : Number(v)) })}>
                    <option value="1">+1</option>
                    <option value="-1">−1</option>
                  </select>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {listError && (
        <p role="alert" className="text-xs font-bold text-finding-critical">
          {listError}
        </p>
      )}
    </FieldGroup>
  );
}
