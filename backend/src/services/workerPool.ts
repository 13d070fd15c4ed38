/**
 * The bounded pool of heavy-work threads (piscina): layout analysis, reach profiles and bands, plan
 * sheets. A request never runs this work on the thread that answers every other request; each task
 * has a time budget, after which its thread is stopped and the request gets 503 too_slow, and the
 * queue is bounded (503 busy beyond it). One pool per process, set up from the config when the app
 * is built (features.ts); work asked for before that uses the default settings.
 */
import Piscina from 'piscina';
import type { Config } from '../config';
import { loadConfig } from '../config';
import { HttpError } from '../http/errors';
import type { HeavyResults, HeavyTask } from '../workers/heavyTasks';

export interface HeavyWorkSettings {
  threads: number;
  taskTimeoutMs: number;
  queueLimit: number;
  heapMb: number;
}

/** The pool settings of a config. */
export const heavyWorkSettings = (c: Config): HeavyWorkSettings => ({
  threads: c.heavyWorkers,
  taskTimeoutMs: c.heavyTaskTimeoutMs,
  queueLimit: c.heavyQueueLimit,
  heapMb: c.heavyWorkerHeapMb,
});

/** heavyBootstrap.mjs (registers tsx) when this module runs as TypeScript; heavyTasks.js beside a compiled build. */
function workerEntry(): string {
  const here = import.meta.url;
  return new URL(here.endsWith('.ts') ? '../workers/heavyBootstrap.mjs' : '../workers/heavyTasks.js', here).href;
}

let current: { settings: HeavyWorkSettings; pool: Piscina } | null = null;

const same = (a: HeavyWorkSettings, b: HeavyWorkSettings) =>
  a.threads === b.threads && a.taskTimeoutMs === b.taskTimeoutMs && a.queueLimit === b.queueLimit && a.heapMb === b.heapMb;

/** Sets the pool up with these settings (a pool with other settings finishes its tasks, then closes). */
export function configureHeavyWork(settings: HeavyWorkSettings): void {
  if (current && same(current.settings, settings)) return;
  const old = current;
  current = {
    settings,
    pool: new Piscina({
      filename: workerEntry(),
      // One thread stays up, its code loaded and its arm models' reach built, so the editor's first
      // view of a layout (GET /layouts/:id/analysis) and small analyses answer without a cold start.
      minThreads: Math.min(1, settings.threads),
      maxThreads: settings.threads,
      maxQueue: settings.queueLimit,
      idleTimeout: 60_000,
      resourceLimits: { maxOldGenerationSizeMb: settings.heapMb },
    }),
  };
  if (old) void old.pool.close().catch(() => undefined);
}

/** Closes the pool (server shutdown); running tasks finish first. */
export async function closeHeavyWork(): Promise<void> {
  const old = current;
  current = null;
  if (old) await old.pool.close();
}

function pool(): { settings: HeavyWorkSettings; pool: Piscina } {
  if (!current) configureHeavyWork(heavyWorkSettings(loadConfig({})));
  return current!;
}

let inFlight = 0;

/** Heavy tasks handed to the pool and not yet answered (running or waiting for a thread). */
export function heavyTasksInFlight(): number {
  return inFlight;
}

const seconds = (ms: number) => (ms % 1000 === 0 ? `${ms / 1000} s` : `${(ms / 1000).toFixed(1)} s`);

/** What to tell the planner when a task of this kind runs too long. */
const ADVICE: Record<HeavyTask['kind'], { what: string; advice: string }> = {
  analysis: { what: 'The analysis', advice: 'split the cell layout or try again' },
  analysisView: { what: 'The analysis', advice: 'split the cell layout or try again' },
  reach: { what: 'Computing the reach', advice: 'simplify the arm model or try again' },
  armSummary: { what: 'Computing the reach', advice: 'simplify the arm model or try again' },
  planSheet: { what: 'Drawing the plan sheet', advice: 'choose fewer sheets or try again' },
};

/**
 * Runs one heavy task in the pool. Rejects with 503 `busy` when the queue is full and 503
 * `too_slow` when the task outlives the time budget (its thread is stopped); a fault inside the
 * task rejects as that error.
 */
export async function runHeavy<K extends HeavyTask['kind']>(task: Extract<HeavyTask, { kind: K }>): Promise<HeavyResults[K]> {
  const { settings, pool: p } = pool();
  const { what, advice } = ADVICE[task.kind];
  const controller = new AbortController();
  const timer = setTimeout(() => controller.abort(), settings.taskTimeoutMs);
  inFlight++;
  try {
    return (await p.run(task, { signal: controller.signal })) as HeavyResults[K];
  } catch (err) {
    if (controller.signal.aborted) throw new HttpError(503, 'too_slow', `${what} took longer than ${seconds(settings.taskTimeoutMs)} and was stopped; ${advice}.`);
    if (err instanceof Error && (err.message === 'Task queue is at limit' || err.message.startsWith('No task queue available'))) {
      throw new HttpError(503, 'busy', `The server is busy with other heavy work (${settings.queueLimit} tasks waiting); try again in a moment.`);
    }
    throw err;
  } finally {
    inFlight--;
    clearTimeout(timer);
  }
}
