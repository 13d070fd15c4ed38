import { NotCoveredError, SafeguardInputError } from '../safety';
import { readableMessage } from '../schemas/errors';
import type { Finding, FindingKind, Severity } from './types';

/**
 * What a finding may say about an error it caught: the sentence of an input problem the planner
 * can fix (arm parameters, J1 limits, a missing model, safeguard data), without its full stop;
 * null for anything internal (geometry failures, argument checks), whose text never goes in a finding.
 */
export function reasonOf(err: unknown): string | null {
  const text = err instanceof SafeguardInputError || err instanceof NotCoveredError ? err.message : readableMessage(err, null);
  return text === null ? null : text.replace(/\.$/, '');
}

/** Stable finding id from its kind and the ids involved (order-independent for pairs). */
export function findingId(kind: FindingKind, ...ids: string[]): string {
  return `${kind}:${ids.join('+')}`;
}

/** The kind and the ids of a finding id made by `findingId`, or null when the text is not one. */
export function parseFindingId(id: string): { kind: FindingKind; ids: string[] } | null {
  const colon = id.indexOf(':');
  if (colon <= 0) return null;
  const kind = id.slice(0, colon);
  if (!Object.prototype.hasOwnProperty.call(SEVERITY_OF, kind)) return null;
  const rest = id.slice(colon + 1);
  return { kind: kind as FindingKind, ids: rest ? rest.split('+') : [] };
}

export const SEVERITY_OF: Record<FindingKind, Severity> = {
  'unreached-point': 'critical',
  'assigned-unreachable': 'critical',
  handover: 'info',
  'shared-zone': 'warning',
  'reach-into-structure': 'warning',
  'base-off-floor': 'critical',
  'base-on-column': 'critical',
  'reach-beyond-fence': 'critical',
  'reach-through-opening': 'warning',
  'fence-clearance': 'warning',
  'fence-too-low': 'warning',
  'reach-into-operator-area': 'critical',
  'reach-into-keepout': 'critical',
  'unknown-model': 'critical',
  'computation-failed': 'warning',
  'opening-too-close': 'critical',
  'stopping-data-missing': 'warning',
  'fence-reach-over': 'critical',
  'fence-reach-through': 'critical',
  'crushing-gap': 'warning',
};

const SEVERITY_RANK: Record<Severity, number> = { critical: 0, warning: 1, info: 2 };

/** Findings in the order people read them: most severe first, then by id. */
export function sortFindings(findings: Finding[]): Finding[] {
  return findings.sort((a, b) => SEVERITY_RANK[a.severity] - SEVERITY_RANK[b.severity] || (a.id < b.id ? -1 : a.id > b.id ? 1 : 0));
}

/** mm² → m², kept to 1 mm² (display rounds further). */
export const m2 = (mm2: number) => Math.round(mm2) / 1e6;
/** m² for messages: 3 decimals. */
export const m2Text = (mm2: number) => (Math.round(mm2 / 1000) / 1000).toFixed(3);
export const mm = (v: number) => Math.round(v);
