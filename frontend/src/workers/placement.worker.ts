/// <reference lib="webworker" />
/**
 * Placement search and auto-layout off the main thread, with the reach adapter the server uses, so
 * the editor's map and candidates are the server's (POST /api/layouts/:id/placement-search).
 */
import { armReachFor } from '@shared/analysis';
import type { FromPlacementWorker, ToPlacementWorker } from './placementProtocol';
import { createPlacementSession } from './placementSession';

const scope = self as unknown as DedicatedWorkerGlobalScope;
const session = createPlacementSession(armReachFor, (m: FromPlacementWorker) => scope.postMessage(m), (fn) => setTimeout(fn, 0));
scope.onmessage = (event: MessageEvent<ToPlacementWorker>) => session.receive(event.data);
