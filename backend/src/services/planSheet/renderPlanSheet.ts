import { createHash } from 'node:crypto';
import { jsPDF } from 'jspdf';
import { summarizeArms } from './armSummary';
import { embedLato } from './fonts';
import { autoScale, drawingArea } from './paper';
import { drawFenceParts } from './fenceSheet';
import { drawPlan, planExtent } from './planDrawing';
import { drawSafeguarding } from './safeguardingSheet';
import { SheetPages } from './sheetPages';
import { drawCoverage, drawFindings, drawHistory, drawSchedule, drawBoundariesSheet } from './tableSheets';
import { DEFAULT_SHEET_KINDS, SCALE_SERIES, SHEET_KINDS, SHEET_SIZES, type PlanSheetInput, type PlanSheetOptions, type SheetKind } from './types';
import { revisionStateLabel } from '@shared/words';

/** Checks the options (throws a short message naming the option). */
function checkOptions(opts: PlanSheetOptions): SheetKind[] {
  if (!SHEET_SIZES.includes(opts.size)) throw new RangeError(`size: use one of ${SHEET_SIZES.join(', ')}`);
  if (opts.scale !== undefined && !(SCALE_SERIES as readonly number[]).includes(opts.scale)) throw new RangeError(`scale: use one of ${SCALE_SERIES.join(', ')}`);
  if (!(opts.createdAt instanceof Date) || Number.isNaN(opts.createdAt.getTime())) throw new RangeError('createdAt: must be a valid date');
  const sheets = opts.sheets ?? [...DEFAULT_SHEET_KINDS];
  for (const s of sheets) if (!SHEET_KINDS.includes(s)) throw new RangeError(`sheets: unknown sheet "${String(s)}"`);
  if (!sheets.length) throw new RangeError('sheets: choose at least one sheet');
  // Print order is fixed whatever order the caller gives.
  return SHEET_KINDS.filter((k) => sheets.includes(k));
}

/**
 * Renders the plan sheet set of a layout or revision as a PDF (landscape ISO A paper, plan at 1:N
 * with plan y north up, tables after it, cautions and a title block on every page). Same input and
 * same `createdAt` give byte-identical output (fixed creation date and file ID).
 */
export async function renderPlanSheet(input: PlanSheetInput, opts: PlanSheetOptions): Promise<Buffer> {
  const sheets = checkOptions(opts);
  const doc = new jsPDF({ orientation: 'landscape', unit: 'mm', format: opts.size.toLowerCase(), compress: true, putOnlyUsedFonts: true, floatPrecision: 3 });
  embedLato(doc);
  doc.setCreationDate(opts.createdAt);
  // File ID from what the sheet shows, so a stored sheet can be checked by its checksum.
  const id = createHash('sha256').update(JSON.stringify([input.layout.id, input.revision?.letter ?? null, opts.createdAt.toISOString(), opts.size, opts.scale ?? null, sheets])).digest('hex').slice(0, 32);
  doc.setFileId(id);
  doc.setDocumentProperties({
    title: `${input.project.name} — ${input.layout.name} — plan sheet`,
    subject: input.revision ? `Revision ${input.revision.letter} (${revisionStateLabel(input.revision.state).toLowerCase()})` : 'Working copy',
    author: input.drawnBy,
    creator: 'Ringfence',
    keywords: 'plan sheet',
  });

  const pages = new SheetPages(doc, opts.size);
  const arms = summarizeArms({ models: input.models, analysis: input.analysis, content: input.layout.content });
  const extent = planExtent(input, arms);
  const n = opts.scale ?? autoScale(extent, drawingArea(pages.frame));
  for (const kind of sheets) {
    if (kind === 'plan') {
      pages.newPage('Plan', 'plan');
      pages.useSide(drawPlan(doc, pages.frame, input, arms, extent, n, opts.size));
    } else if (kind === 'schedule') drawSchedule(pages, arms);
    else if (kind === 'coverage') drawCoverage(pages, input, arms);
    else if (kind === 'boundaries') drawBoundariesSheet(pages, input);
    else if (kind === 'safeguarding') drawSafeguarding(pages, input);
    else if (kind === 'fences') drawFenceParts(pages, input, extent, n);
    else if (kind === 'findings') drawFindings(pages, input);
    else drawHistory(pages, input);
  }
  pages.finish(input, { createdAt: opts.createdAt, draft: opts.draft, scale: sheets.includes('plan') ? n : null });
  return Buffer.from(doc.output('arraybuffer'));
}
