/**
 * The inspector's safeguard and mesh fields as typed (text) → what the layout stores, checked by the
 * layout schema (shared/schemas/layout.ts); errors are keyed by field and name the field's label.
 */
import { MESH_SHAPE_NAMES, SAFEGUARD_DEVICE_NAMES, Safeguard, type Boundary } from '@shared/schemas/layout';
import { issueSentence } from '@shared/schemas/labels';
import { parseNumber } from './armForm';

export type SafeguardDeviceName = (typeof SAFEGUARD_DEVICE_NAMES)[number];
export type MeshShapeName = (typeof MESH_SHAPE_NAMES)[number];

/** What each device is called in the inspector. */
export const DEVICE_LABEL: Record<SafeguardDeviceName, string> = {
  interlock: 'Interlocked guard (door)',
  'interlock-locking': 'Interlocked guard with guard locking',
  'light-curtain': 'Light curtain',
  'multi-beam': 'Multi-beam device',
  'single-beam': 'Single beam',
};

export interface SafeguardFormValues {
  /** '' = no safeguard. */
  device: SafeguardDeviceName | '';
  responseTimeS: string;
  /** '' = not chosen yet. */
  stopCategory: '' | '0' | '1';
  resolutionMm: string;
  beams: string;
  approach: 'normal' | 'parallel';
  heightMm: string;
}

export type SafeguardField = keyof SafeguardFormValues;

/** The label of each field, as the inspector shows it (errors start with it). */
export const SAFEGUARD_FIELD_LABEL: Record<SafeguardField, string> = {
  device: 'Safeguard',
  responseTimeS: 'Response time (s)',
  stopCategory: 'Stop category',
  resolutionMm: 'Resolution (mm)',
  beams: 'Beams',
  approach: 'Approach',
  heightMm: 'Detection height (mm)',
};

const text = (v: number | undefined) => (v === undefined ? '' : String(v));

/** The form values of an opening's stored safeguard (empty fields when it has none). */
export function safeguardFormValues(z: Boundary): SafeguardFormValues {
  const g = z.safeguard;
  return {
    device: g?.device ?? '',
    responseTimeS: text(g?.responseTimeS),
    stopCategory: g ? (String(g.stopCategory) as '0' | '1') : '',
    resolutionMm: text(g?.resolutionMm),
    beams: text(g?.beams),
    approach: g?.approach ?? 'normal',
    heightMm: text(g?.heightMm),
  };
}

/** Which fields a device asks for. */
export function safeguardFieldsFor(device: SafeguardDeviceName | '', approach: 'normal' | 'parallel'): SafeguardField[] {
  if (!device) return ['device'];
  const f: SafeguardField[] = ['device', 'responseTimeS', 'stopCategory'];
  if (device === 'light-curtain') f.push('resolutionMm', 'approach', ...(approach === 'parallel' ? (['heightMm'] as const) : []));
  if (device === 'multi-beam') f.push('beams');
  return f;
}

export type SafeguardParse = { ok: true; safeguard: Safeguard | null } | { ok: false; errors: Partial<Record<SafeguardField, string>> };

/** The safeguard to store (null = none), or the errors to show beside the fields. */
export function parseSafeguardForm(v: Readonly<SafeguardFormValues>): SafeguardParse {
  if (!v.device) return { ok: true, safeguard: null };
  const errors: Partial<Record<SafeguardField, string>> = {};
  const fields = safeguardFieldsFor(v.device, v.approach);
  const num = (field: SafeguardField, raw: string, required: string | null): number | undefined => {
    if (!fields.includes(field) || raw.trim() === '') {
      if (required && fields.includes(field)) errors[field] = `${SAFEGUARD_FIELD_LABEL[field]}: ${required}`;
      return undefined;
    }
    const n = parseNumber(raw);
    if (n === null) errors[field] = `${SAFEGUARD_FIELD_LABEL[field]}: enter a number`;
    return n ?? undefined;
  };
  const responseTimeS = num('responseTimeS', v.responseTimeS, "give the device's response time from its data sheet");
  const resolutionMm = num('resolutionMm', v.resolutionMm, null);
  const beams = num('beams', v.beams, null);
  const heightMm = num('heightMm', v.heightMm, null);
  if (v.stopCategory === '') errors.stopCategory = `${SAFEGUARD_FIELD_LABEL.stopCategory}: choose the stop the device triggers (0 or 1)`;
  if (Object.keys(errors).length) return { ok: false, errors };
  const candidate = {
    device: v.device,
    responseTimeS,
    stopCategory: Number(v.stopCategory),
    ...(resolutionMm !== undefined ? { resolutionMm } : {}),
    ...(beams !== undefined ? { beams } : {}),
    ...(v.device === 'light-curtain' ? { approach: v.approach } : {}),
    ...(heightMm !== undefined ? { heightMm } : {}),
  };
  const r = Safeguard.safeParse(candidate);
  if (r.success) return { ok: true, safeguard: r.data };
  for (const issue of r.error.issues) {
    const key = issue.path[0];
    const field: SafeguardField = typeof key === 'string' && key in SAFEGUARD_FIELD_LABEL ? (key as SafeguardField) : 'device';
    errors[field] ??= issueSentence(issue, { input: candidate });
  }
  return { ok: false, errors };
}

export type MeshParse = { ok: true; meshMm: number | null; meshShape: MeshShapeName | null } | { ok: false; errors: Partial<Record<'meshMm' | 'meshShape', string>> };

/** A fence's mesh as typed: both empty (no mesh given) or a size up to 120 mm with its shape. */
export function parseMeshForm(size: string, shape: MeshShapeName | ''): MeshParse {
  if (size.trim() === '' && shape === '') return { ok: true, meshMm: null, meshShape: null };
  const n = size.trim() === '' ? null : parseNumber(size);
  const errors: Partial<Record<'meshMm' | 'meshShape', string>> = {};
  if (size.trim() === '') errors.meshMm = 'Mesh size (mm): give the size of the mesh openings';
  else if (n === null) errors.meshMm = 'Mesh size (mm): enter a number';
  else if (n <= 0) errors.meshMm = 'Mesh size (mm): must be greater than 0';
  else if (n > 120) errors.meshMm = 'Mesh size (mm): at most 120 mm; larger openings let a body through — draw an access opening';
  if (shape === '') errors.meshShape = 'Mesh shape: choose slot, square or round';
  if (Object.keys(errors).length) return { ok: false, errors };
  return { ok: true, meshMm: n!, meshShape: shape as MeshShapeName };
}
