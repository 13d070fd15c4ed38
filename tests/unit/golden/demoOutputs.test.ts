// The demo's outputs, pinned: the analysis JSON, the plan-sheet PDF and the DXF export of the
// Fernhill cell must stay byte-identical across refactors. A change that means to alter them
// regenerates the pins on purpose (`REGEN=1 npx vitest run tests/unit/golden`) and the diff of
// tests/fixtures/golden/demo.json is reviewed with it.
import { createHash } from 'node:crypto';
import { existsSync, readFileSync, writeFileSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { layoutDxf, renderPlanSheet } from '../../../backend/src/services/planSheet';
import { demoSheetInput } from '../../support/planSheetInput';

const pinFile = path.join(path.dirname(fileURLToPath(import.meta.url)), '../../fixtures/golden/demo.json');
const sha = (b: string | Uint8Array) => createHash('sha256').update(b).digest('hex');

async function outputs() {
  const input = demoSheetInput();
  const { timingMs: _timing, ...analysis } = input.analysis;
  const pdf = await renderPlanSheet(input, { size: 'A3', draft: true, createdAt: new Date('2026-03-02T09:00:00Z') });
  return {
    analysisSha256: sha(JSON.stringify(analysis)),
    findingIds: analysis.findings.map((f) => f.id),
    planSheetSha256: sha(pdf),
    planSheetBytes: pdf.length,
    dxfSha256: sha(layoutDxf(input, { createdAt: new Date('2026-03-02T09:00:00Z') })),
  };
}

describe('demo outputs', () => {
  it('are byte-identical to the pinned analysis, plan sheet and DXF', async () => {
    const now = await outputs();
    if (process.env.REGEN === '1') {
      writeFileSync(pinFile, JSON.stringify(now, null, 2) + '\n');
      return;
    }
    expect(existsSync(pinFile), 'pin file missing: run with REGEN=1 once and review it').toBe(true);
    const pinned = JSON.parse(readFileSync(pinFile, 'utf8')) as typeof now;
    expect(now.findingIds).toEqual(pinned.findingIds);
    expect(now.analysisSha256).toBe(pinned.analysisSha256);
    expect(now.dxfSha256).toBe(pinned.dxfSha256);
    expect(now.planSheetBytes).toBe(pinned.planSheetBytes);
    expect(now.planSheetSha256).toBe(pinned.planSheetSha256);
  }, 60_000);
});
