// The one way a benchmark reports: a figure against its target, or a check that holds or not.
// Every line says met or MISSED, the figure, the target, the ratio (figure / target) and the
// machine load at that moment (1-minute load average over the core count), so figures taken on a
// busy machine read as such. tests/bench/run.ts collects the results (BENCH_RESULTS, one JSON
// line each) into "N met, N missed"; a benchmark run on its own prints that line when it ends.
// A missed target is reported, never an error; a failed check (a wrong answer, not a slow one)
// makes the benchmark exit non-zero. A figure that has no target (a comparison) goes through
// info(): the same line, counted neither way.
import { appendFileSync } from 'node:fs';
import os from 'node:os';

export type Better = 'lower' | 'higher';

export interface Figure {
  /** What was measured, in words ("reach profile, scara, Demo SCARA 600 (median of 15)"). */
  what: string;
  figure: number;
  /** Unit of figure and target ("ms", "M checks/s", "×"). */
  unit: string;
  target: number;
  better: Better;
  /** More about the run, printed after the figures. */
  note?: string;
  /** Decimals for figure and target (default: by size). */
  digits?: number;
}

const RESULTS = process.env.BENCH_RESULTS;
const counts = { met: 0, missed: 0 };
let summaryHooked = false;

function digitsFor(v: number): number {
  const a = Math.abs(v);
  return a >= 100 ? 0 : a >= 10 ? 1 : a >= 1 ? 2 : 3;
}

const num = (v: number, digits?: number) => (Number.isFinite(v) ? v.toFixed(digits ?? digitsFor(v)) : String(v));

/** "load 1.42 / 2 cores": the 1-minute load average when the line is printed. */
export function machineLoad(): string {
  return `load ${os.loadavg()[0].toFixed(2)} / ${os.cpus().length} cores`;
}

function record(what: string, met: boolean): void {
  if (met) counts.met++;
  else counts.missed++;
  if (RESULTS) appendFileSync(RESULTS, `${JSON.stringify({ what, met })}\n`);
  else if (!summaryHooked) {
    summaryHooked = true;
    process.on('exit', () => console.log(`\n${counts.met} met, ${counts.missed} missed`));
  }
}

/** Prints one figure against its target and records whether it met it. Returns met. */
export function report(f: Figure): boolean {
  const met = f.better === 'lower' ? f.figure <= f.target : f.figure >= f.target;
  const r = f.figure / f.target;
  const ratio = f.target === 0 ? (f.figure === 0 ? 'ratio —' : 'ratio ∞') : `ratio ${r === 0 || Math.abs(r) >= 0.1 ? r.toFixed(2) : r.toPrecision(2)}`;
  const sign = f.better === 'lower' ? '≤' : '≥';
  const unit = f.unit ? ` ${f.unit}` : '';
  console.log(
    `${met ? 'met   ' : 'MISSED'} ${f.what}: ${num(f.figure, f.digits)}${unit} (target ${sign} ${num(f.target, f.digits)}${unit}, ${ratio}; ${machineLoad()})` +
      (f.note ? ` — ${f.note}` : ''),
  );
  record(f.what, met);
  return met;
}

/** Prints a check (something that must hold, whatever the speed); a failed one fails the benchmark. */
export function check(what: string, ok: boolean, detail = ''): boolean {
  console.log(`${ok ? 'met   ' : 'MISSED'} check: ${what}${detail ? ` — ${detail}` : ''} (${machineLoad()})`);
  record(what, ok);
  if (!ok) process.exitCode = 1;
  return ok;
}


/** Prints a figure that has no target (a comparison, what one setting buys over another). */
export function info(what: string, figure: number, unit: string, note = '', digits?: number): void {
  console.log(`info   ${what}: ${num(figure, digits)}${unit ? ` ${unit}` : ''} (no target; ${machineLoad()})${note ? ` — ${note}` : ''}`);
}
