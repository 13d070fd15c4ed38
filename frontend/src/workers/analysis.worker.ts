/// <reference lib="webworker" />
/**
 * The layout analysis off the main thread: one session (analyzer + reach regions + floor) for the
 * life of the editor page, with the same reach adapter the server's analysis uses. Messages that
 * arrive while an analysis runs are folded together: only the latest input is analysed next.
 */
import { armReachFor } from '@shared/analysis';
import { readableMessage } from '@shared/schemas/errors';
import type { FromWorker, ToWorker } from './analysisProtocol';
import { createAnalysisSession } from './analysisSession';
import { createDeltaEncoder } from './analysisDelta';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const session = createAnalysisSession(armReachFor);
// Results cross as deltas against the previous one sent: a whole result of a large layout takes
// longer to copy between threads than to compute.
const encoder = createDeltaEncoder();
/** Shown for an internal failure, whose own text is no message for people. */
const FAILED = 'the checks hit a problem with this layout; undo the last change or reload the page';
let scheduled = false;
// The analyzer's list of changed coverage rows is against its run before; it holds for the delta
// only when that run's result was encoded too (not after a failed run).
let encodedLast = true;

function runLatest(): void {
  scheduled = false;
  let out: FromWorker | null = null;
  try {
    const r = session.run();
    if (r) {
      const { seq, dragging, coverageChanged, ...view } = r;
      out = { type: 'result', seq, dragging, delta: encoder.encode(view, encodedLast ? coverageChanged : null) };
      encodedLast = true;
    }
  } catch (err) {
    console.error(err);
    encodedLast = false;
    out = { type: 'error', seq: session.currentSeq(), message: readableMessage(err, FAILED) };
  }
  if (out) scope.postMessage(out);
}

scope.onmessage = (event: MessageEvent<ToWorker>) => {
  let again: boolean;
  try {
    again = session.receive(event.data);
  } catch (err) {
    console.error(err);
    scope.postMessage({ type: 'error', seq: 'seq' in event.data ? event.data.seq : 0, message: readableMessage(err, FAILED) } satisfies FromWorker);
    return;
  }
  if (again && !scheduled) {
    scheduled = true;
    setTimeout(runLatest, 0);
  }
};
