// Plan-sheet benchmark: the full sheet set (plan, schedule, coverage, boundaries, findings, history) of a
// generated 40-arm layout, A3 draft. Targets: render ≤ 1 s, file ≤ 2 MB (printed with ratios).
// The analysis is done once before timing (the route runs it too, but it is the analysis' own cost).
// Run: npm run bench planSheet   (or node --import tsx tests/bench/planSheet.bench.ts [out.pdf])
import { writeFileSync } from 'node:fs';
import { renderPlanSheet } from '../../backend/src/services/planSheet';
import { demoSheetInput, gridSheetInput } from '../support/planSheetInput';

const TIME_TARGET_MS = 1000;
const SIZE_TARGET_BYTES = 2 * 1024 * 1024;
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
  console.log(
    `${name}: ${input.layout.content.arms.length} arms, ${input.layout.content.workPoints.length} points, ${pages} pages — ` +
      `median ${median.toFixed(0)} ms (target ${TIME_TARGET_MS} ms, ratio ${(median / TIME_TARGET_MS).toFixed(2)}), ` +
      `${(pdf.length / 1024).toFixed(0)} KiB (target ${SIZE_TARGET_BYTES / 1024} KiB, ratio ${(pdf.length / SIZE_TARGET_BYTES).toFixed(2)})`,
  );
  if (out) writeFileSync(out, pdf);
  return { median, size: pdf.length };
}

const out = process.argv[2];
await measure('Fernhill demo', demoSheetInput(), out ? out.replace(/\.pdf$/, '-demo.pdf') : undefined);
const r = await measure('40-arm grid', gridSheetInput(40), out);
if (r.median > TIME_TARGET_MS || r.size > SIZE_TARGET_BYTES) console.log('40-arm grid: over target');
