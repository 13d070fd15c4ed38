import { Worker } from 'node:worker_threads';
import type { ImportResult } from '@shared/schemas/floorPlan';
import { DxfImportError, DXF_IMPORT_ERROR_CODES, type DxfImportErrorCode } from './errors';
import type { ImportOptions } from './importDxf';
import { unpackResult, type PackedResult } from './transfer';
import type { WorkerJob, WorkerReply } from './worker';

export interface WorkerOptions {
  /** Time allowed for one import, ms (default 60 s). */
  timeoutMs?: number;
  /** Heap limit of the worker, MB (default 2048): a runaway file stops the worker, not the server. */
  maxHeapMb?: number;
}

/**
 * The worker's entry: worker.js beside a compiled build; workerBootstrap.mjs (which registers
 * tsx in the worker, then loads worker.ts) when this module runs as TypeScript (tsx, vitest).
 */
function workerEntry(): URL {
  const here = import.meta.url;
  return new URL(here.endsWith('.ts') ? './workerBootstrap.mjs' : './worker.js', here);
}

/**
 * Runs importDxf in a worker thread so a large file never blocks the caller's event loop.
 * Resolves with the same ImportResult; rejects with the same DxfImportError (code, message,
 * line) as an in-process import, with code 'timeout' after `timeoutMs`, and 'internal' when
 * the worker dies (e.g. out of memory).
 */
export function parseInWorker(input: string | Uint8Array, opts: ImportOptions = {}, w: WorkerOptions = {}): Promise<ImportResult> {
  return parseInWorkerPacked(input, opts, w).then(unpackResult);
}

/**
 * parseInWorker's result as it leaves the worker (transfer.ts), for callers that only store or
 * send on the geometry (packedGeometryJson) and so never need its GeoJSON objects.
 */
export function parseInWorkerPacked(input: string | Uint8Array, opts: ImportOptions = {}, w: WorkerOptions = {}): Promise<PackedResult> {
  const timeoutMs = w.timeoutMs ?? 60_000;
  const entry = workerEntry();
  return new Promise<PackedResult>((resolve, reject) => {
    let settled = false;
    const worker = new Worker(entry, {
      resourceLimits: { maxOldGenerationSizeMb: w.maxHeapMb ?? 2048 },
      stdout: true,
      stderr: true,
    });
    // the parser's own console output stays inside the worker
    worker.stdout.resume();
    worker.stderr.resume();
    const finish = (fn: () => void) => {
      if (settled) return;
      settled = true;
      clearTimeout(timer);
      fn();
      void worker.terminate();
    };
    const timer = setTimeout(() => {
      finish(() =>
        reject(
          new DxfImportError(
            'timeout',
            `Reading the drawing took longer than ${Math.round(timeoutMs / 1000)} s and was stopped. Remove detail the floor plan does not need and try again.`,
          ),
        ),
      );
    }, timeoutMs);
    worker.once('message', (reply: WorkerReply) => {
      finish(() => {
        if (reply.ok) return resolve(reply.result);
        const { code, message, line } = reply.error;
        if (code === 'invalid-options') return reject(new RangeError(message));
        const known = (DXF_IMPORT_ERROR_CODES as readonly string[]).includes(code);
        reject(new DxfImportError(known ? (code as DxfImportErrorCode) : 'internal', message, line));
      });
    });
    worker.once('error', (err: Error & { code?: string }) => {
      finish(() =>
        reject(
          new DxfImportError(
            'internal',
            err.code === 'ERR_WORKER_OUT_OF_MEMORY'
              ? 'The drawing needs more memory than one import may use. Remove detail the floor plan does not need and try again.'
              : 'The drawing could not be read because the import stopped unexpectedly. Please try again.',
          ),
        ),
      );
    });
    worker.once('exit', (code) => {
      finish(() =>
        reject(new DxfImportError('internal', `The drawing could not be read because the import stopped unexpectedly (exit code ${code}).`)),
      );
    });
    const job: WorkerJob = { input, opts };
    worker.postMessage(job);
  });
}
