/**
 * The Safeguarding sheet: per safeguarded access opening the ISO 13855 separation distance (device,
 * T, S required, actual, verdict), per fence the ISO 13857 distances (height, mesh, hazard height a,
 * c required, actual, verdict), the stopping data used and where it came from, and the caution that
 * these are planning checks.
 */
import type { SafeguardFenceRow, SafeguardOpeningRow } from '@shared/analysis';
import type { SheetPages } from './sheetPages';
import { drawTable, type Cell, type Column, type Row } from './table';
import type { PlanSheetInput } from './types';

/** Printed under the tables (in the spirit of the product's cautions). */
export const SAFEGUARDING_CAUTION =
  'These are planning checks from nominal reach and the stopping data entered in the arm models. The distances must be verified with the maker\'s measured stopping data and the installed devices, by a competent person under ISO 13855, ISO 13857 and local codes; they do not replace the risk assessment (ISO 12100) or the robot-system safety requirements (ISO 10218-2).';

const DEVICE_TEXT: Record<SafeguardOpeningRow['device'], string> = {
  interlock: 'interlocked guard',
  'interlock-locking': 'interlocked guard, guard locking',
  'light-curtain': 'light curtain',
  'multi-beam': 'multi-beam device',
  'single-beam': 'single beam',
};
const STOP_FIELD_TEXT: Record<SafeguardOpeningRow['stopField'], string> = { stopTimeS: 'stop time, category 0', stopTimeCat1S: 'stop time, category 1' };

const mmText = (v: number | null) => (v === null ? '—' : `${Math.round(v)}`);
function verdict(ok: boolean | null, unknown: string): Cell {
  if (ok === null) return { text: unknown, bold: true, colour: [120, 80, 0] };
  return ok ? { text: 'meets', bold: true, colour: [20, 100, 50] } : { text: 'too close', bold: true, colour: [255, 255, 255], fill: [196, 40, 40] };
}

function heading(pages: SheetPages, y: number, text: string): number {
  const box = pages.contentBox();
  if (y + 20 > box.y + box.h) {
    pages.continuePage();
    y = pages.contentBox().y - 6;
  }
  pages.doc.setFont('Lato', 'bold');
  pages.doc.setFontSize(9);
  pages.doc.setTextColor(28, 34, 48);
  pages.doc.text(text, box.x, y + 8);
  return y + 11;
}

function paragraph(pages: SheetPages, y: number, text: string, bold = false): number {
  const box = pages.contentBox();
  const doc = pages.doc;
  doc.setFont('Lato', bold ? 'bold' : 'normal');
  doc.setFontSize(7.5);
  doc.setTextColor(60, 64, 72);
  const lines = doc.splitTextToSize(text, box.w) as string[];
  if (y + lines.length * 3.4 + 2 > box.y + box.h) {
    pages.continuePage();
    y = pages.contentBox().y;
  }
  lines.forEach((l, i) => doc.text(l, box.x, y + 4 + i * 3.4));
  return y + 4 + lines.length * 3.4;
}

function rest(pages: SheetPages, y: number) {
  const box = pages.contentBox();
  return { x: box.x, y, w: box.w, h: box.y + box.h - y };
}

/** The Safeguarding sheet of a layout or revision (from its analysis' `safeguarding` rows). */
export function drawSafeguarding(pages: SheetPages, input: PlanSheetInput): void {
  pages.newPage('Safeguarding', 'safeguarding');
  let y = pages.contentBox().y - 6;
  const sg = input.analysis.safeguarding;
  const boundaries = new Map(input.layout.content.boundaries.map((z) => [z.id, z]));
  const models = new Map(input.models.map((m) => [m.id, m]));
  const armLabel = (id: string | null) => {
    if (!id) return '—';
    const a = input.layout.content.arms.find((x) => x.id === id);
    return a?.label ? `${id} ${a.label}` : id;
  };
  if (!sg) {
    y = paragraph(pages, y + 6, 'This revision was frozen before the analysis made safeguarding checks; submit a new revision to see them.', true);
    paragraph(pages, y + 2, SAFEGUARDING_CAUTION);
    return;
  }

  y = heading(pages, y, 'Access openings — separation distance (ISO 13855)');
  if (!sg.openings.length) {
    y = paragraph(pages, y - 2, 'No access opening on this cell layout carries a safeguard.');
  } else {
    const cols: Column[] = [
      { title: 'Opening', width: 30 },
      { title: 'Device', width: 36 },
      { title: 'Stop cat.', width: 14, align: 'center' },
      { title: 'Governing arm', width: 30 },
      { title: 'T s', width: 14, align: 'right' },
      { title: 'S required mm', width: 22, align: 'right' },
      { title: 'Actual mm', width: 18, align: 'right' },
      { title: 'Verdict', width: 20, align: 'center' },
      { title: 'How S was found', width: 106, wrap: true },
    ];
    const rows: Row[] = sg.openings.map((o) => {
      const z = boundaries.get(o.id);
      return {
        cells: [
          { text: z?.label ? `${o.id} ${z.label}` : o.id, bold: true },
          DEVICE_TEXT[o.device],
          String(o.stopCategory),
          armLabel(o.armId),
          o.tS === null ? '—' : String(o.tS),
          o.requiredMm === null ? 'not computed' : mmText(o.requiredMm),
          mmText(o.actualMm),
          verdict(o.ok, o.armId ? 'data missing' : 'no arm'),
          o.note,
        ],
      };
    });
    y = drawTable(pages.doc, rest(pages, y), pages.fit(cols), rows, () => pages.continuePage());
  }

  y = heading(pages, y, 'Fences — reach over and reach through (ISO 13857)');
  if (!sg.fences.length) {
    y = paragraph(pages, y - 2, 'The cell layout has no fences.');
  } else {
    const cols: Column[] = [
      { title: 'Fence', width: 30 },
      { title: 'Height b mm', width: 18, align: 'right' },
      { title: 'Mesh', width: 22 },
      { title: 'Governing arm', width: 30 },
      { title: 'Hazard a mm', width: 18, align: 'right' },
      { title: 'c required mm', width: 20, align: 'right' },
      { title: 's_r mm', width: 14, align: 'right' },
      { title: 'Actual mm', width: 18, align: 'right' },
      { title: 'Verdict', width: 20, align: 'center' },
      { title: 'Note', width: 100, wrap: true },
    ];
    const rows: Row[] = sg.fences.map((f: SafeguardFenceRow) => {
      const z = boundaries.get(f.id);
      return {
        cells: [
          { text: z?.label ? `${f.id} ${z.label}` : f.id, bold: true },
          mmText(f.heightMm),
          f.meshMm === null ? 'solid / not given' : `${f.meshMm} mm ${f.meshShape}`,
          armLabel(f.armId),
          mmText(f.hazardHeightMm),
          f.armId && f.requiredMm === null ? 'not covered' : mmText(f.requiredMm),
          mmText(f.reachThroughMm),
          mmText(f.actualMm),
          verdict(f.ok, 'not covered'),
          f.note,
        ],
      };
    });
    y = drawTable(pages.doc, rest(pages, y), pages.fit(cols), rows, () => pages.continuePage());
  }

  // Where each stopping time came from: the arm model and its field, or that the model lacks it.
  y = heading(pages, y, 'Stopping data used');
  const used = sg.openings.filter((o) => o.armId && o.device !== 'interlock-locking');
  if (!used.length) {
    y = paragraph(pages, y - 2, 'No separation distance on this cell layout needs a stopping time.');
  } else {
    const cols: Column[] = [
      { title: 'Opening', width: 30 },
      { title: 'Arm', width: 36 },
      { title: 'Arm model', width: 60 },
      { title: 'Field', width: 44 },
      { title: 'Stopping time', width: 120, wrap: true },
    ];
    const rows: Row[] = used.map((o) => {
      const m = o.armModelId === null ? undefined : models.get(o.armModelId);
      return {
        cells: [
          { text: o.id, bold: true },
          armLabel(o.armId),
          m ? m.name : `model ${o.armModelId}`,
          STOP_FIELD_TEXT[o.stopField],
          o.stopTimeS === null
            ? { text: `not given in the arm model: no separation distance computed (enter the maker's measured category ${o.stopCategory} stopping time)`, bold: true, colour: [150, 60, 0] }
            : `${o.stopTimeS} s`,
        ],
      };
    });
    y = drawTable(pages.doc, rest(pages, y), pages.fit(cols), rows, () => pages.continuePage());
  }
  paragraph(pages, y + 3, SAFEGUARDING_CAUTION, true);
}
