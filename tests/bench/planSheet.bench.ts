// Plan-sheet benchmark: the full sheet set (plan, schedule, coverage, boundaries, findings, history) of a
// generated 40-arm layout, A3 draft. Targets: render ≤ 500 ms, file ≤ 1 MB (printed with ratios).
// The analysis is done once before timing (the route runs it too, but it is the analysis' own cost).
// Beside the wall-clock median, the median CPU time of the process per render (process.cpuUsage) is
// printed: on a shared machine it says more than the clock.
// Run: npm run bench planSheet   (or node --import tsx tests/bench/planSheet.bench.ts [out.pdf])
import { writeFileSync } from 'node:fs';
import { renderPlanSheet } from '../../backend/src/services/planSheet';
import { demoSheetInput, gridSheetInput } from '../support/planSheetInput';
import { info, report } from './report';

const TIME_TARGET_MS = 500;
const SIZE_TARGET_BYTES = 1024 * 1024;
const RUNS = 5;

async function measure(name: string, input: ReturnType<typeof gridSheetInput>, out?: string) {
  const opts = { size: 'A3' as const, draft: true, createdAt: new Date('2025-03-01T09:00:00Z') };
  await renderPlanSheet(input, opts); // warm-up (font bytes read, code compiled)
  const times: number[] = [];
  const cpu: number[] = [];
  let pdf: Buffer = Buffer.alloc(0);
  for (let i = 0; i < RUNS; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    pdf = await renderPlanSheet(input, opts);
    times.push(performance.now() - t0);
    const c = process.cpuUsage(c0);
    cpu.push((c.user + c.system) / 1000);
  }
  const middle = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)];
  const median = middle(times);
  const pages = (pdf.toString('latin1').match(/\/Type \/Page\b/g) ?? []).length;
  const about = `${input.layout.content.arms.length} arms, ${input.layout.content.workPoints.length} points, ${pages} pages`;
  report({ what: `plan sheet set, ${name}, render (median of ${RUNS})`, figure: median, unit: 'ms', target: TIME_TARGET_MS, better: 'lower', digits: 0, note: about });
  info(`plan sheet set, ${name}, render CPU time (median of ${RUNS})`, middle(cpu), 'ms', 'user + system time of the process', 0);
  report({ what: `plan sheet set, ${name}, file size`, figure: pdf.length / 1024, unit: 'KiB', target: SIZE_TARGET_BYTES / 1024, better: 'lower', digits: 0 });
  if (out) writeFileSync(out, pdf);
}

const out = process.argv[2];
await measure('Fernhill demo', demoSheetInput(), out ? out.replace(/\.pdf$/, '-demo.pdf') : undefined);
await measure('40-arm grid', gridSheetInput(40), out);
