// Runs importDxf off the request thread: one job per worker (see parseInWorker.ts).
import { parentPort } from 'node:worker_threads';
import { isDxfImportError } from './errors';
import { importDxf, type ImportOptions } from './importDxf';
import { packedBuffers, packResult, type PackedResult } from './transfer';

export interface WorkerJob {
  input: string | Uint8Array;
  opts?: ImportOptions;
}

export type WorkerReply =
  | { ok: true; result: PackedResult }
  | { ok: false; error: { code: string; message: string; line?: number } };

if (!parentPort) throw new Error('worker.ts: must run as a worker thread');
const port = parentPort;

port.once('message', (job: WorkerJob) => {
  let reply: WorkerReply;
  try {
    reply = { ok: true, result: packResult(importDxf(job.input, job.opts)) };
  } catch (err) {
    if (isDxfImportError(err)) {
      reply = { ok: false, error: err.toJSON() };
    } else if (err instanceof RangeError && /^[a-zA-Z]+: /.test(err.message)) {
      // invalid options: a programming error of the caller, passed on as it is
      reply = { ok: false, error: { code: 'invalid-options', message: err.message } };
    } else {
      reply = {
        ok: false,
        error: { code: 'internal', message: 'The drawing could not be read because of a fault in the import. Please report the file.' },
      };
    }
  }
  // coordinates move as typed arrays (transferred, not cloned)
  port.postMessage(reply, reply.ok ? packedBuffers(reply.result) : []);
});
