import { useId } from 'react';
import { pickerUnits, UNIT_NAMES, type UnitName } from '@shared/schemas/floorPlan';

const SOURCE_TEXT = {
  header: 'Read from the file header ($INSUNITS).',
  default: 'The file header names no unit, so millimetres were assumed. Choose the unit the drawing was made in.',
  chosen: 'Chosen by hand; the drawing was re-read in this unit.',
} as const;

/** The drawing unit, where it came from, and (for planners) a choice that re-reads the drawing. */
export function UnitsPicker({
  units,
  source,
  onChange,
  busy,
}: {
  units: UnitName;
  source: keyof typeof SOURCE_TEXT;
  onChange?: (units: UnitName) => void;
  busy?: boolean;
}) {
  const id = useId();
  const label = UNIT_NAMES.find((u) => u.name === units)?.label ?? units;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-xs font-bold tracking-wide text-ink-muted uppercase">
        Drawing unit
      </label>
      {onChange ? (
        <select
          id={id}
          value={units}
          disabled={busy}
          onChange={(e) => onChange(e.target.value as UnitName)}
          className="h-9 w-64 rounded-control border border-rule-strong bg-paper-raised px-3 text-sm"
        >
          {pickerUnits(units).map((u) => (
            <option key={u.name} value={u.name}>
              {u.label}
            </option>
          ))}
        </select>
      ) : (
        <p id={id} className="text-sm font-bold">
          {label}
        </p>
      )}
      <p className="text-xs text-ink-muted" data-units-source={source}>
        {busy ? 'Re-reading the drawing…' : SOURCE_TEXT[source]}
      </p>
    </div>
  );
}
