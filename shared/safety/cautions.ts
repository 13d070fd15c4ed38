/**
 * The cautions every output that shows reach or safeguarding carries: the editor's findings, the
 * plan sheet (every page), the CSV and DXF exports. One wording, here; the glossary and
 * docs/product.md explain why they are there. Pure data.
 */
export const CAUTIONS: readonly string[] = [
  'Reach regions, distances and margins are planning estimates from nominal kinematics and catalogue axis limits.',
  'Restricted spaces cover the links, tool and payload as sized in the arm model (link radii are estimates); cables, dress pack and the base are not included.',
  "They do not replace the risk assessment (ISO 12100), the robot-system safety requirements of ISO 10218-2 or the arm maker's stopping data.",
  'Safeguarding must be designed and validated by a competent person under the local codes and regulations.',
];

/** The cautions as one paragraph. */
export const CAUTION_TEXT = CAUTIONS.join(' ');

/** A moment as exports print it: ISO date and time to the minute, UTC. */
export function exportStamp(at: Date): string {
  return `${at.toISOString().slice(0, 16).replace('T', ' ')} UTC`;
}

/**
 * The notes an export file opens with (CSV comment lines, DXF header comments and notes layer):
 * what it is, of which cell layout, in which state (working copy or revision letter), when, the
 * frame its numbers are in, and the cautions.
 */
export function exportNotes(o: { what: string; layoutName: string; state: string; at: Date }): string[] {
  return [
    `Ringfence ${o.what} · cell layout ${o.layoutName} · ${o.state} · exported ${exportStamp(o.at)}`,
    'Lengths in mm; plan x east, y plan north (+y), z above finished floor level.',
    ...CAUTIONS,
  ];
}
