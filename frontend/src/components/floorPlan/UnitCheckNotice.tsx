import type { UnitCheck } from '@shared/geometry';
import { UNIT_NAMES, type UnitName } from '@shared/schemas/floorPlan';
import { Button } from '../Button';

/**
 * Says that the drawing's extent is not plausible for a building floor in its unit, and (for
 * planners) offers the unit that would make it plausible as one click; nothing when it is.
 */
export function UnitCheckNotice({ check, onChoose, busy }: { check: UnitCheck; onChoose?: (units: UnitName) => void; busy?: boolean }) {
  if (check.plausible || !check.message) return null;
  const s = check.suggestion;
  const label = s ? (UNIT_NAMES.find((u) => u.name === s.units)?.label ?? s.units).toLowerCase() : null;
  return (
    <section
      aria-label="Drawing unit check"
      data-unit-check={s?.units ?? 'none'}
      className="flex flex-wrap items-center gap-3 rounded-control border border-finding-warning/40 border-l-4 border-l-finding-warning bg-finding-warning-wash px-4 py-3 text-sm"
    >
      <p className="min-w-0 flex-1">
        <span className="font-bold text-finding-warning">The size does not fit the unit. </span>
        {check.message}
      </p>
      {s && onChoose && (
        <Button variant="primary" size="sm" busy={busy} onClick={() => onChoose(s.units)}>
          Read in {label}
        </Button>
      )}
    </section>
  );
}
