/// <reference lib="webworker" />
/**
 * The layout analysis off the main thread: one session (analyzer + reach regions + floor) for the
 * life of the editor page, with the same reach adapter the server's analysis uses. Messages that
 * arrive while an analysis runs are folded together: only the latest input is analysed next.
 */
import { armReachFor } from '@shared/analysis';
import type { FromWorker, ToWorker } from './analysisProtocol';
import { createAnalysisSession } from './analysisSession';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const session = createAnalysisSession(armReachFor);
let scheduled = false;

function runLatest(): void {
  scheduled = false;
  let out: FromWorker | null = null;
  try {
    const r = session.run();
    if (r) out = { type: 'result', ...r };
  } catch (err) {
    out = { type: 'error', seq: session.currentSeq(), message: err instanceof Error ? err.message : String(err) };
  }
  if (out) scope.postMessage(out);
}

scope.onmessage = (event: MessageEvent<ToWorker>) => {
  let again: boolean;
  try {
    again = session.receive(event.data);
  } catch (err) {
    scope.postMessage({ type: 'error', seq: 'seq' in event.data ? event.data.seq : 0, message: err instanceof Error ? err.message : String(err) } satisfies FromWorker);
    return;
  }
  if (again && !scheduled) {
    scheduled = true;
    setTimeout(runLatest, 0);
  }
};
