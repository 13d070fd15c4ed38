/**
 * The arm inspector's form as text fields (what a person types) and its parsing into a placement
 * patch with one message per field. Lengths mm, angles degrees (controller angles for J1 limits).
 */
import { issueSentence } from '@shared/schemas/labels';
import { ArmPlacement } from '@shared/schemas/layout';

export const ARM_FIELDS = ['label', 'x', 'y', 'yaw', 'mountHeight', 'j1Min', 'j1Max'] as const;
export type ArmField = (typeof ARM_FIELDS)[number];
export type ArmFormValues = Record<ArmField, string>;
export type ArmFormErrors = Partial<Record<ArmField, string>>;

const fmt = (v: number) => String(Math.round(v * 10) / 10);

/** The form's text for an arm. */
export function armFormValues(a: ArmPlacement): ArmFormValues {
  return {
    label: a.label ?? '',
    x: fmt(a.x),
    y: fmt(a.y),
    yaw: fmt(a.yaw),
    mountHeight: fmt(a.mountHeight ?? 0),
    j1Min: a.restrict ? fmt(a.restrict.j1Min) : '',
    j1Max: a.restrict ? fmt(a.restrict.j1Max) : '',
  };
}

/** A number typed with a point or a comma as decimal mark (spaces as thousands separators allowed); null when it is not one. */
export function parseNumber(text: string): number | null {
  const t = text.trim().replace(/\s+/g, '').replace(',', '.');
  if (!/^[-+]?(\d+\.?\d*|\.\d+)$/.test(t)) return null;
  const n = Number(t);
  return Number.isFinite(n) ? n : null;
}

/**
 * Parses the form against the arm it edits: the patch to apply, or the errors to show beside the
 * fields (checked with the layout schema, so the form and the server agree).
 */
export function parseArmForm(arm: ArmPlacement, v: ArmFormValues): { ok: true; patch: Partial<ArmPlacement> } | { ok: false; errors: ArmFormErrors } {
  const errors: ArmFormErrors = {};
  const num = (field: ArmField, what: string): number | undefined => {
    const n = parseNumber(v[field]);
    if (n === null) errors[field] = v[field].trim() === '' ? `Give the ${what}` : `${what[0].toUpperCase()}${what.slice(1)} must be a number`;
    return n ?? undefined;
  };
  const x = num('x', 'x position');
  const y = num('y', 'y position');
  const yaw = num('yaw', 'yaw');
  const mountHeight = num('mountHeight', 'mount height');
  let restrict: ArmPlacement['restrict'];
  const hasMin = v.j1Min.trim() !== '';
  const hasMax = v.j1Max.trim() !== '';
  if (hasMin || hasMax) {
    if (!hasMin) errors.j1Min = 'Give both J1 limits, or neither';
    if (!hasMax) errors.j1Max = 'Give both J1 limits, or neither';
    const j1Min = hasMin ? num('j1Min', 'J1 min') : undefined;
    const j1Max = hasMax ? num('j1Max', 'J1 max') : undefined;
    if (j1Min !== undefined && j1Max !== undefined) {
      if (j1Min >= j1Max) errors.j1Max = 'J1 max must be above J1 min';
      else restrict = { j1Min, j1Max };
    }
  }
  if (yaw !== undefined && (yaw < -360 || yaw > 360)) errors.yaw = 'Yaw must be between −360° and 360°';
  if (mountHeight !== undefined && (mountHeight < -5000 || mountHeight > 20000)) errors.mountHeight = 'Mount height must be between −5 000 and 20 000 mm';
  if (Object.keys(errors).length) return { ok: false, errors };
  const patch: Partial<ArmPlacement> = { label: v.label.trim(), x: x!, y: y!, yaw: yaw!, mountHeight: mountHeight!, restrict };
  const checked = ArmPlacement.safeParse({ ...arm, ...patch, ...(restrict ? {} : { restrict: undefined }) });
  if (!checked.success) {
    for (const issue of checked.error.issues) {
      const key = String(issue.path[issue.path.length - 1] ?? '');
      const field = (ARM_FIELDS as readonly string[]).includes(key) ? (key as ArmField) : key === 'restrict' ? 'j1Max' : 'label';
      errors[field] ??= issueSentence(issue);
    }
    return { ok: false, errors };
  }
  return { ok: true, patch };
}
