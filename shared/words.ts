/**
 * The product's words for the values users see: one table per concept, read by the screens, the
 * plan sheet, the DXF and CSV exports and the mails, so a thing has one name everywhere. The
 * glossary in docs/glossary.md explains each word; tests/unit/docs/vocabulary.test.ts keeps the
 * retired words out of everything a user reads. Pure data, no imports.
 */

/** States of a revision as users read them (the drawing trade's words for the reviewer's decisions). */
export const REVISION_STATE_LABEL = {
  submitted: 'Submitted',
  returned: 'Returned for changes',
  signed_off: 'Signed off',
  released: 'Released',
} as const satisfies Record<'submitted' | 'returned' | 'signed_off' | 'released', string>;

/** Kinematic families of arm models. */
export const FAMILY_LABEL = {
  scara: 'SCARA',
  articulated: 'Articulated',
  linkage: 'Linkage-driven',
  chain: 'DH chain',
} as const satisfies Record<'scara' | 'articulated' | 'linkage' | 'chain', string>;

/** The family's label, or the stored value itself when a newer family is not in the table. */
export function familyLabel(family: string): string {
  return (FAMILY_LABEL as Record<string, string>)[family] ?? family;
}

/**
 * Each kind of boundary (what the planner draws on a cell layout besides arms and work points; the
 * umbrella word keeps "zone" for the shared zone of two arms), as named inside a sentence.
 */
export const BOUNDARY_KIND_WORD = {
  fence: 'guard fence',
  opening: 'access opening',
  keepout: 'keep-out',
  operator: 'operator area',
} as const satisfies Record<'fence' | 'opening' | 'keepout' | 'operator', string>;

/** Id prefixes of new elements, the same as the demo's (R1, P1, F1, O1, K1, OP1). */
export const ID_PREFIX = { arm: 'R', workPoint: 'P', fence: 'F', opening: 'O', keepout: 'K', operator: 'OP' } as const;

/** Severities of findings. */
export const SEVERITY_LABEL = { critical: 'Critical', warning: 'Warning', info: 'Note' } as const satisfies Record<'critical' | 'warning' | 'info', string>;

/** The two reach figures of an arm model, named apart: they are different numbers. */
export const REACH_FIGURE_LABEL = {
  /** Largest radial distance of the tool point's reach profile (what the catalogue lists). */
  toolPoint: 'Tool-point reach',
  /** Largest radius of the maximum space: the whole moving arm with tool and payload (the plan sheet's schedule). */
  maximumSpace: 'Maximum-space radius',
} as const;

/** A revision state's label from a stored value (states stored under older names read the same). */
export function revisionStateLabel(state: string): string {
  const legacy: Record<string, keyof typeof REVISION_STATE_LABEL> = { changes_requested: 'returned', approved: 'signed_off' };
  const key = (legacy[state] ?? state) as keyof typeof REVISION_STATE_LABEL;
  return REVISION_STATE_LABEL[key] ?? state;
}

/** How a work point is approached by the tool. */
export const APPROACH_LABEL = { top: 'From above', any: 'Any direction' } as const satisfies Record<'top' | 'any', string>;

/**
 * The plan's reference direction. Floor plans carry no surveyed true north, so every plan drawing
 * (sheet, editor key) marks plan north: the drawing's +y axis, up on paper and on screen.
 */
export const PLAN_NORTH = { mark: 'PN', label: 'Plan north (+y)' } as const;

/** What a cell layout shown or exported is: the editable working copy, or a frozen revision. */
export function layoutStateWords(revision: { letter: string; state: string } | null): string {
  return revision ? `Revision ${revision.letter} · ${revisionStateLabel(revision.state)}` : 'Working copy (not a revision)';
}
