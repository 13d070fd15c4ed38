import { runHeavy } from '../workerPool';
import type { PlanSheetInput, PlanSheetOptions } from './types';

/** renderPlanSheet run in the heavy-work pool: the same bytes, off the request thread. */
export async function renderPlanSheetInPool(input: PlanSheetInput, opts: PlanSheetOptions): Promise<Buffer> {
  const bytes = await runHeavy({ kind: 'planSheet', input, opts });
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}
