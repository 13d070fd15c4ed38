import { checkedFloorOf, ConcernLookup, concernsText, findingConcerns, isReached, noFindingsSentence } from '@shared/analysis';
import type { Severity } from '@shared/analysis';
import type { ArmSummary } from './armSummary';
import type { SheetPages } from './sheetPages';
import { drawTable, type Column, type Row } from './table';
import type { PlanSheetInput } from './types';
import { BOUNDARY_KIND_WORD, familyLabel, REACH_FIGURE_LABEL, revisionStateLabel, SEVERITY_LABEL } from '@shared/words';

const MINUS = '\u2212';
const fmtMm = (v: number) => (v < 0 ? `${MINUS}${Math.round(-v)}` : `${Math.round(v)}`);
const signed = (v: number) => (v > 0 ? `+${Math.round(v)}` : v < 0 ? `${MINUS}${Math.round(-v)}` : '0');
const NOT_REACHED_ROW: Row['fill'] = [252, 226, 224];
const SEVERITY_STYLE: Record<Severity, { fill: [number, number, number]; colour: [number, number, number] }> = {
  critical: { fill: [196, 40, 40], colour: [255, 255, 255] },
  warning: { fill: [246, 196, 90], colour: [60, 40, 0] },
  info: { fill: [214, 226, 240], colour: [28, 50, 90] },
};
const SEVERITY_ORDER: Record<Severity, number> = { critical: 0, warning: 1, info: 2 };

function dateText(d: Date | string | null | undefined): string {
  if (!d) return '—';
  const t = typeof d === 'string' ? new Date(d) : d;
  return Number.isNaN(t.getTime()) ? String(d) : t.toISOString().slice(0, 10);
}

function note(pages: SheetPages, text: string): void {
  const b = pages.contentBox();
  pages.doc.setFont('Lato', 'normal');
  pages.doc.setFontSize(8);
  pages.doc.setTextColor(90, 94, 102);
  pages.doc.text(text, b.x, b.y + 4);
}

/** Arm schedule: one row per arm (position, yaw, mount height, reach, restricting J1 limits, stopping time). */
export function drawSchedule(pages: SheetPages, arms: ArmSummary[]): void {
  pages.newPage('Arm schedule', 'schedule');
  if (!arms.length) return note(pages, 'This cell layout places no arms.');
  const cols: Column[] = [
    { title: 'Arm', width: 40 },
    { title: 'Model', width: 46 },
    { title: 'Family', width: 22 },
    { title: 'x mm', width: 20, align: 'right' },
    { title: 'y mm', width: 20, align: 'right' },
    { title: 'Yaw °', width: 15, align: 'right' },
    { title: 'Mount height mm', width: 20, align: 'right' },
    { title: `${REACH_FIGURE_LABEL.maximumSpace} mm`, width: 22, align: 'right' },
    { title: 'Restricting J1 limits', width: 34 },
    { title: 'Stop time s', width: 17, align: 'right' },
  ];
  const rows: Row[] = arms.map((a) => ({
    cells: [
      { text: a.title, bold: true },
      a.modelName,
      familyLabel(a.family),
      fmtMm(a.arm.x),
      fmtMm(a.arm.y),
      `${+a.arm.yaw.toFixed(1)}`,
      fmtMm(a.arm.mountHeight),
      a.maxSpaceRadius === null ? '—' : fmtMm(a.maxSpaceRadius),
      a.arm.restrict ? `${+a.arm.restrict.j1Min.toFixed(1)}° to ${+a.arm.restrict.j1Max.toFixed(1)}°` : 'none (model limits)',
      a.stopTimeS === null ? 'not given' : `${a.stopTimeS}`,
    ],
  }));
  drawTable(pages.doc, pages.contentBox(), pages.fit(cols), rows, () => pages.continuePage());
}

/**
 * Coverage matrix: work points × arms, margins in mm (positive = reached). Arms are split into
 * column groups that fit the page width; rows continue on further pages. Points no arm reaches are
 * highlighted.
 */
export function drawCoverage(pages: SheetPages, input: PlanSheetInput, arms: ArmSummary[]): void {
  const points = input.layout.content.workPoints;
  if (!points.length || !arms.length) {
    pages.newPage('Coverage matrix', 'coverage');
    return note(pages, points.length ? 'This cell layout places no arms.' : 'This cell layout has no work points.');
  }
  const lead: Column[] = [
    { title: 'Point', width: 20 },
    { title: 'Tag', width: 26 },
    { title: 'z above floor mm', width: 14, align: 'right' },
    { title: 'Assigned arm', width: 16 },
  ];
  const tail: Column = { title: 'Reached by', width: 22 };
  const armW = 15;
  const avail = pages.contentBox().w - lead.reduce((s, c) => s + c.width, 0) - tail.width;
  const perGroup = Math.max(1, Math.floor(avail / armW));
  const groups: ArmSummary[][] = [];
  for (let i = 0; i < arms.length; i += perGroup) groups.push(arms.slice(i, i + perGroup));
  groups.forEach((g, gi) => {
    const suffix = groups.length > 1 ? ` — arms ${g[0].arm.id} to ${g[g.length - 1].arm.id} (group ${gi + 1} of ${groups.length})` : '';
    pages.newPage(`Coverage matrix${suffix}`, 'coverage');
    const cols: Column[] = [...lead, ...g.map((a) => ({ title: a.arm.id, width: armW, align: 'right' as const })), tail];
    const rows: Row[] = points.map((p) => {
      const m = input.analysis.coverage[p.id] ?? {};
      const reachedBy = arms.filter((a) => isReached(m[a.arm.id] ?? -Infinity)).length;
      return {
        fill: reachedBy === 0 ? NOT_REACHED_ROW : undefined,
        cells: [
          { text: p.id, bold: true },
          p.tag,
          fmtMm(p.z),
          p.assignedArm ?? '—',
          ...g.map((a) => {
            const v = m[a.arm.id];
            if (v === undefined || !Number.isFinite(v)) return { text: '—', colour: [150, 150, 150] as [number, number, number] };
            return isReached(v) ? { text: signed(v), colour: [20, 100, 50] as [number, number, number] } : { text: signed(v), colour: [150, 150, 150] as [number, number, number] };
          }),
          reachedBy === 0 ? { text: 'not reached', bold: true, colour: [170, 30, 30] as [number, number, number] } : `${reachedBy} arm${reachedBy === 1 ? '' : 's'}`,
        ],
      };
    });
    drawTable(pages.doc, pages.contentBox(), cols, rows, () => pages.continuePage());
  });
}

/** Shared zones (arm pairs, area m², points inside) and the layout's boundaries (fences, openings, areas). */
export function drawBoundariesSheet(pages: SheetPages, input: PlanSheetInput): void {
  pages.newPage('Shared zones and boundaries', 'boundaries');
  const doc = pages.doc;
  const sharedZones = input.analysis.sharedZones;
  let y: number;
  if (!sharedZones.length) {
    note(pages, 'No shared zones: no two arms\' restricted spaces overlap on this cell layout.');
    y = pages.contentBox().y + 8;
  } else {
    const cols: Column[] = [
      { title: 'Shared zone', width: 34 },
      { title: 'Area m²', width: 20, align: 'right' },
      { title: 'At work heights (m²)', width: 70, wrap: true },
      { title: 'Work points inside', width: 110, wrap: true },
    ];
    const rows: Row[] = sharedZones.map((s) => ({
      cells: [
        { text: `${s.arms[0]} + ${s.arms[1]}`, bold: true },
        s.areaM2.toFixed(2),
        s.byHeight.length ? s.byHeight.map((h) => `${Math.round(h.height)} mm: ${h.areaM2.toFixed(2)}`).join(', ') : '—',
        s.points.length ? s.points.join(', ') : 'none',
      ],
    }));
    y = drawTable(doc, pages.contentBox(), pages.fit(cols), rows, () => pages.continuePage());
  }
  const boundaries = input.layout.content.boundaries;
  const box = pages.contentBox();
  if (y + 20 > box.y + box.h) {
    pages.continuePage();
    y = pages.contentBox().y - 6;
  }
  doc.setFont('Lato', 'bold');
  doc.setFontSize(9);
  doc.setTextColor(28, 34, 48);
  doc.text('Boundaries of the cell layout', box.x, y + 8);
  if (!boundaries.length) {
    doc.setFont('Lato', 'normal');
    doc.setFontSize(8);
    doc.text('The cell layout has no boundaries: no guard fences, access openings, keep-outs or operator areas.', box.x, y + 14);
    return;
  }
  const cols: Column[] = [
    { title: 'Boundary', width: 24 },
    { title: 'Kind', width: 30 },
    { title: 'Label', width: 50 },
    { title: 'Height mm', width: 20, align: 'right' },
    { title: 'Points', width: 14, align: 'right' },
    { title: 'In fence', width: 20 },
  ];
  const rows: Row[] = boundaries.map((z) => ({
    cells: [{ text: z.id, bold: true }, BOUNDARY_KIND_WORD[z.kind], z.label || '—', z.height === undefined ? '—' : fmtMm(z.height), String(z.points.length), z.fenceId ?? '—'],
  }));
  drawTable(doc, { x: box.x, y: y + 11, w: box.w, h: box.y + box.h - (y + 11) }, cols, rows, () => pages.continuePage());
}

/** Findings, most severe first, with their message and what each concerns by name (arms, boundaries, layers; work points apart). */
export function drawFindings(pages: SheetPages, input: PlanSheetInput): void {
  pages.newPage('Findings', 'findings');
  const findings = [...input.analysis.findings].sort((a, b) => SEVERITY_ORDER[a.severity] - SEVERITY_ORDER[b.severity] || a.id.localeCompare(b.id));
  if (!findings.length) return note(pages, noFindingsSentence(input.layout.content, checkedFloorOf(input.floorPlan?.layers)));
  const cols: Column[] = [
    { title: 'Severity', width: 18, align: 'center' },
    { title: 'Finding', width: 150, wrap: true },
    { title: 'Concerns', width: 82, wrap: true },
    { title: 'Work points', width: 40, wrap: true },
  ];
  const lookup = new ConcernLookup(input.layout.content);
  const rows: Row[] = findings.map((f) => {
    const concerns = findingConcerns(f, lookup);
    const points = f.points.length > 12 ? `${f.points.slice(0, 12).join(', ')} and ${f.points.length - 12} more` : f.points.join(', ');
    return {
      cells: [
        { text: SEVERITY_LABEL[f.severity], bold: true, ...SEVERITY_STYLE[f.severity] },
        f.message,
        concernsText(concerns.filter((c) => c.role !== 'work point')) || '—',
        points || '—',
      ],
    };
  });
  drawTable(pages.doc, pages.contentBox(), pages.fit(cols), rows, () => pages.continuePage());
}

/** Revision history, oldest first. */
export function drawHistory(pages: SheetPages, input: PlanSheetInput): void {
  pages.newPage('Revision history', 'history');
  if (!input.history.length) return note(pages, 'No revisions yet: this sheet shows the working copy.');
  const cols: Column[] = [
    { title: 'Rev', width: 14, align: 'center' },
    { title: 'State', width: 28 },
    { title: 'Date', width: 24 },
    { title: 'By', width: 44 },
    { title: 'Note', width: 150, wrap: true },
  ];
  const rows: Row[] = input.history.map((h) => ({ cells: [{ text: h.letter, bold: true }, revisionStateLabel(h.state), dateText(h.at), h.by ?? '—', h.note ?? ''] }));
  drawTable(pages.doc, pages.contentBox(), pages.fit(cols), rows, () => pages.continuePage());
}

export { dateText };
