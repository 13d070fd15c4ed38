/**
 * What crosses from the analysis worker to the page after the first result: only what changed.
 * A structured clone of a whole result of a large cell layout (100 arms, 50 000 work points: some
 * 11 MB of findings, margins and regions) costs hundreds of milliseconds per drag frame, while one
 * moved arm changes a few hundred findings, the margins of the points near it and its own regions.
 * The worker's encoder remembers what it sent; the page's decoder rebuilds the whole view from the
 * deltas in the order they were sent. Pure; the round trip is tested against the full views.
 */
import type { AnalysisResult, Finding } from '@shared/analysis';
import type { AreaGeometry } from '@shared/geometry';
import type { AnalysisView, ViewDelta } from './analysisProtocol';

type Region = AnalysisResult['regions'][string];
type CoverageRow = AnalysisResult['coverage'][string];

export type { ViewDelta };


function sameRow(a: CoverageRow, b: CoverageRow): boolean {
  let n = 0;
  for (const k in a) {
    if (a[k] !== b[k]) return false;
    n++;
  }
  for (const _k in b) n--;
  return n === 0;
}

function sameRegion(a: Region, b: Region): boolean {
  if (a === b) return true;
  if (a.restricted !== b.restricted || a.bands.length !== b.bands.length) return false;
  return a.bands.every((x, i) => x.height === b.bands[i].height && x.geometry === b.bands[i].geometry);
}

/**
 * The worker side: `encode(view)` gives the delta against the previous view it encoded. Objects the
 * analyzer keeps between runs (findings, regions and maximum spaces of arms that did not move) are
 * recognised by identity; coverage rows, which the analyzer updates in place, by their values.
 */
export function createDeltaEncoder() {
  let started = false;
  let findings = new Map<string, Finding>();
  let lastOrder: string[] = [];
  const coverage = new Map<string, CoverageRow>();
  let regions = new Map<string, Region>();
  let maxSpaces = new Map<string, AreaGeometry | null>();

  return {
    /**
     * `coverageChanged`, when given, lists every point whose coverage row may differ from the view
     * encoded before (the analyzer knows them); the other rows are not compared. Without it (or on
     * the first view) every row is.
     */
    encode(view: AnalysisView, coverageChanged?: ReadonlyArray<string> | null): ViewDelta {
      const a = view.analysis;
      const reset = !started;
      started = true;
      // Findings the analyzer kept are the same objects: send those that are not. While the ids
      // come in the order sent before (a drag, mostly), the map is patched; else built anew.
      const list = a.findings;
      const changed: Finding[] = [];
      let sameOrder = !reset && list.length === lastOrder.length;
      for (let i = 0; i < list.length; i++) {
        const f = list[i];
        if (sameOrder && lastOrder[i] !== f.id) sameOrder = false;
        if (reset || findings.get(f.id) !== f) changed.push(f);
      }
      let duplicate = false;
      let order: string[] = lastOrder;
      if (sameOrder) {
        for (const f of changed) findings.set(f.id, f);
      } else {
        const nextFindings = new Map<string, Finding>();
        order = new Array<string>(list.length);
        for (let i = 0; i < list.length; i++) {
          const f = list[i];
          if (nextFindings.has(f.id)) duplicate = true;
          nextFindings.set(f.id, f);
          order[i] = f.id;
        }
        findings = nextFindings;
      }
      // Ids are unique by construction (findingId); should two ever share one, send the list whole.
      const wholeFindings = duplicate;
      if (duplicate) findings = new Map();
      lastOrder = wholeFindings ? [] : order;

      const cov: Record<string, CoverageRow> = {};
      const hinted = !reset && coverageChanged != null;
      const pids = hinted ? coverageChanged : Object.keys(a.coverage);
      const sizeBefore = coverage.size;
      let added = 0;
      for (const pid of pids) {
        const row = a.coverage[pid];
        const prev = coverage.get(pid);
        if (prev === undefined) added++;
        if (reset || prev === undefined || !sameRow(prev, row)) {
          const copy = { ...row };
          cov[pid] = copy;
          coverage.set(pid, copy);
        }
      }
      // Points gone since the last result: only looked for when the counts say there are some (a
      // hint comes only with the same points, so none are gone then).
      const coverageRemoved: string[] = [];
      if (!hinted && sizeBefore + added > pids.length) {
        const now = new Set(pids);
        for (const pid of coverage.keys()) if (!now.has(pid)) coverageRemoved.push(pid);
        for (const pid of coverageRemoved) coverage.delete(pid);
      }

      const reg: Record<string, Region> = {};
      const nextRegions = new Map<string, Region>();
      for (const id in a.regions) {
        const r = a.regions[id];
        nextRegions.set(id, r);
        const prev = regions.get(id);
        if (reset || !prev || !sameRegion(prev, r)) reg[id] = r;
      }
      const regionsRemoved = [...regions.keys()].filter((id) => !nextRegions.has(id));
      regions = nextRegions;

      const spaces: Record<string, AreaGeometry | null> = {};
      const nextSpaces = new Map<string, AreaGeometry | null>();
      for (const id in view.maxSpaces) {
        const g = view.maxSpaces[id];
        nextSpaces.set(id, g);
        if (reset || !maxSpaces.has(id) || maxSpaces.get(id) !== g) spaces[id] = g;
      }
      const maxSpacesRemoved = [...maxSpaces.keys()].filter((id) => !nextSpaces.has(id));
      maxSpaces = nextSpaces;

      return {
        reset: reset || wholeFindings,
        findingOrder: wholeFindings ? [] : sameOrder ? null : order,
        findings: wholeFindings ? a.findings.slice() : changed,
        coverage: cov,
        coverageRemoved,
        regions: reg,
        regionsRemoved,
        maxSpaces: spaces,
        maxSpacesRemoved,
        sharedZones: a.sharedZones,
        safeguarding: a.safeguarding,
        timingMs: a.timingMs,
        placed: view.placed,
        section: view.section ?? null,
      };
    },
  };
}

/**
 * The page side: `decode(delta)` applies every delta in the order sent (also those too old to show)
 * and returns the whole view. Each part that changed is a new object, each that did not keeps its
 * identity, so memoised drawing redoes only what changed — but for the coverage object itself:
 * its changed rows are new objects put into the one object (copying tens of thousands of rows per
 * drag result held the page up), so readers key their memos on the analysis or the rows, never on
 * the coverage object's identity.
 */
export function createDeltaDecoder() {
  const findings = new Map<string, Finding>();
  let order: string[] = [];
  // The findings list last returned and each id's place in it (while the order stays, a delta
  // patches a copy of the list instead of looking every id up again).
  let lastList: Finding[] = [];
  let position = new Map<string, number>();
  let coverage: AnalysisResult['coverage'] = {};
  let regions: AnalysisResult['regions'] = {};
  let maxSpaces: AnalysisView['maxSpaces'] = {};

  const patch = <T,>(base: Record<string, T>, changed: Record<string, T>, removed: string[], reset: boolean): Record<string, T> => {
    if (reset) return { ...changed };
    let any = removed.length > 0;
    for (const _k in changed) {
      any = true;
      break;
    }
    if (!any) return base;
    const out = { ...base, ...changed };
    for (const k of removed) delete out[k];
    return out;
  };

  return {
    decode(d: ViewDelta): AnalysisView {
      let list: Finding[];
      if (d.reset && d.findingOrder !== null && d.findingOrder.length === 0 && d.findings.length > 0) {
        // Sent whole (ids not unique): keep no map.
        findings.clear();
        order = [];
        list = d.findings;
        // The encoder sends the order again with the next non-empty list.
        lastList = [];
        position = new Map();
      } else {
        if (d.reset) findings.clear();
        for (const f of d.findings) findings.set(f.id, f);
        if (d.findingOrder !== null || d.reset) {
          if (d.findingOrder !== null) order = d.findingOrder;
          list = order.map((id) => findings.get(id)!);
          position = new Map(order.map((id, i) => [id, i]));
          if (findings.size !== order.length) {
            const keep = new Set(order);
            for (const id of [...findings.keys()]) if (!keep.has(id)) findings.delete(id);
          }
        } else if (d.findings.length) {
          // The same order as before (a drag, mostly): the list before with the changed ones put in.
          list = lastList.slice();
          for (const f of d.findings) list[position.get(f.id)!] = f;
        } else {
          list = lastList;
        }
        lastList = list;
      }
      if (d.reset) coverage = { ...d.coverage };
      else {
        for (const pid in d.coverage) coverage[pid] = d.coverage[pid];
        for (const pid of d.coverageRemoved) delete coverage[pid];
      }
      regions = patch(regions, d.regions, d.regionsRemoved, d.reset);
      maxSpaces = patch(maxSpaces, d.maxSpaces, d.maxSpacesRemoved, d.reset);
      const analysis: AnalysisResult = { findings: list, sharedZones: d.sharedZones, coverage, regions, timingMs: d.timingMs };
      if (d.safeguarding !== undefined) analysis.safeguarding = d.safeguarding;
      return { analysis, maxSpaces, placed: d.placed, section: d.section };
    },
  };
}
