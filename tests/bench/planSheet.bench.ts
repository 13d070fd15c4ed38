// Plan-sheet benchmark: the full sheet set (plan, schedule, coverage, boundaries, findings, history) of a
// generated 40-arm layout, A3 draft. Targets: render ≤ 500 ms, file ≤ 1 MB (printed with ratios).
// The analysis is done once before timing (the route runs it too, but it is the analysis' own cost).
// Run: npm run bench planSheet   (or node --import tsx tests/bench/planSheet.bench.ts [out.pdf])
import { writeFileSync } from 'node:fs';
import { renderPlanSheet } from '../../backend/src/services/planSheet';
import { demoSheetInput, gridSheetInput } from '../support/planSheetInput';
import { report } from './report';

const TIME_TARGET_MS = 500;
const SIZE_TARGET_BYTES = 1024 * 1024;
const RUNS = 5;

async function measure(name: string, input: ReturnType<typeof gridSheetInput>, out?: string) {
  const opts = { size: 'A3' as const, draft: true, createdAt: new Date('2025-03-01T09:00:00Z') };
  await renderPlanSheet(input, opts); // warm-up (font bytes read, code compiled)
  const times: number[] = [];
  let pdf: Buffer = Buffer.alloc(0);
  for (let i = 0; i < RUNS; i++) {
    const t0 = performance.now();
    pdf = await renderPlanSheet(input, opts);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const median = times[Math.floor(times.length / 2)];
  const pages = (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length;
  const about = `${input.layout.content.arms.length} arms, ${input.layout.content.workPoints.length} points, ${pages} pages`;
  report({ what: `plan sheet set, ${name}, render (median of ${RUNS})`, figure: median, unit: 'ms', target: TIME_TARGET_MS, better: 'lower', digits: 0, note: about });
  report({ what: `plan sheet set, ${name}, file size`, figure: pdf.length / 1024, unit: 'KiB', target: SIZE_TARGET_BYTES / 1024, better: 'lower', digits: 0 });
  if (out) writeFileSync(out, pdf);
}

const out = process.argv[2];
await measure('Fernhill demo', demoSheetInput(), out ? out.replace(/\.pdf$/, '-demo.pdf') : undefined);
await measure('40-arm grid', gridSheetInput(40), out);
