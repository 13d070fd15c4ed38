import { readFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { z } from 'zod';
import { multiLineText } from '@shared/schemas/fields';
import { LayoutContent } from '@shared/schemas/layout';

export const DEMO_HISTORY_FILE = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '../../../samples/demo-history.json');

const Moment = z
  .object({
    daysBefore: z.number().int('Use whole days').min(1, 'Use at least 1 day, so nothing lies in the future').max(365),
    time: z.string().regex(/^([01]\d|2[0-3]):[0-5]\d$/, 'Write the time of day as HH:MM (UTC)'),
  })
  .strict();
const Note = multiLineText().min(1, 'Write the comment').max(10_000);
const Decided = Moment.extend({ comment: Note });
const ArmMove = z
  .object({ id: z.string().min(1), x: z.number().finite().optional(), y: z.number().finite().optional(), yaw: z.number().finite().optional() })
  .strict();

const DemoHistoryFile = z
  .object({
    about: z.string(),
    accountsCreated: Moment,
    projectCreated: Moment,
    floorPlanImported: Moment,
    layoutDrawn: Moment,
    revisionA: z.object({ firstDraft: z.object({ about: z.string(), arms: z.array(ArmMove).min(1) }).strict(), submitted: Moment, returned: Decided }).strict(),
    revisionB: z.object({ edited: Moment, submitted: Moment, signedOff: Decided, released: Moment }).strict(),
  })
  .strict();
type DemoHistoryFile = z.infer<typeof DemoHistoryFile>;

/** The demo's history with its times resolved against the day it is seeded. */
export interface DemoHistory {
  accountsCreated: Date;
  projectCreated: Date;
  floorPlanImported: Date;
  layoutDrawn: Date;
  revisionA: { firstDraftArms: DemoHistoryFile['revisionA']['firstDraft']['arms']; submitted: Date; returned: Date; returnComment: string };
  revisionB: { edited: Date; submitted: Date; signedOff: Date; signOffComment: string; released: Date };
}

const where = (file: string) => path.relative(path.resolve(path.dirname(file), '..'), file);

/**
 * Reads samples/demo-history.json with its times as dates: whole days before the UTC day of `now`,
 * at the given UTC time. Throws naming the file and the field on a bad entry or times out of order.
 */
export function readDemoHistory(now: Date, file = DEMO_HISTORY_FILE): DemoHistory {
  const parsed = DemoHistoryFile.safeParse(JSON.parse(readFileSync(file, 'utf8')));
  if (!parsed.success) {
    const first = parsed.error.issues[0];
    throw new Error(`${where(file)}: ${first?.path.join('.') || 'file'}: ${first?.message ?? 'invalid'}`);
  }
  const h = parsed.data;
  const at = (m: z.infer<typeof Moment>) => {
    const [hh, mm] = m.time.split(':').map(Number);
    return new Date(Date.UTC(now.getUTCFullYear(), now.getUTCMonth(), now.getUTCDate() - m.daysBefore, hh, mm));
  };
  const order: Array<[string, z.infer<typeof Moment>]> = [
    ['accountsCreated', h.accountsCreated],
    ['projectCreated', h.projectCreated],
    ['floorPlanImported', h.floorPlanImported],
    ['layoutDrawn', h.layoutDrawn],
    ['revisionA.submitted', h.revisionA.submitted],
    ['revisionA.returned', h.revisionA.returned],
    ['revisionB.edited', h.revisionB.edited],
    ['revisionB.submitted', h.revisionB.submitted],
    ['revisionB.signedOff', h.revisionB.signedOff],
    ['revisionB.released', h.revisionB.released],
  ];
  for (let i = 1; i < order.length; i++) {
    const [prevName, prev] = order[i - 1];
    const [name, cur] = order[i];
    if (at(cur) < at(prev)) throw new Error(`${where(file)}: ${name} (${cur.daysBefore} days before, ${cur.time}) comes before ${prevName} (${prev.daysBefore} days before, ${prev.time})`);
  }
  return {
    accountsCreated: at(h.accountsCreated),
    projectCreated: at(h.projectCreated),
    floorPlanImported: at(h.floorPlanImported),
    layoutDrawn: at(h.layoutDrawn),
    revisionA: { firstDraftArms: h.revisionA.firstDraft.arms, submitted: at(h.revisionA.submitted), returned: at(h.revisionA.returned), returnComment: h.revisionA.returned.comment },
    revisionB: {
      edited: at(h.revisionB.edited),
      submitted: at(h.revisionB.submitted),
      signedOff: at(h.revisionB.signedOff),
      signOffComment: h.revisionB.signedOff.comment,
      released: at(h.revisionB.released),
    },
  };
}

/** The working copy as first drawn: its arms moved to where the history's first draft had them (validated by the layout schema). */
export function firstDraftOf(workingCopy: LayoutContent, history: DemoHistory): LayoutContent {
  const draft = structuredClone(workingCopy);
  for (const move of history.revisionA.firstDraftArms) {
    const arm = draft.arms.find((a) => a.id === move.id);
    if (!arm) throw new Error(`${where(DEMO_HISTORY_FILE)}: revisionA.firstDraft names arm ${move.id}, which the demo layout does not have`);
    if (move.x !== undefined) arm.x = move.x;
    if (move.y !== undefined) arm.y = move.y;
    if (move.yaw !== undefined) arm.yaw = move.yaw;
  }
  return LayoutContent.parse(draft);
}
