// Entry of a heavy-work thread when the server runs as TypeScript (tsx or vitest): registers tsx's
// loader in this thread, then hands the pool the handler of heavyTasks.ts (as the DXF worker's
// bootstrap does: a loader from the parent's execArgv does not reach a worker's entry module).
import { register } from 'tsx/esm/api';

register();
const tasks = await import('./heavyTasks.ts');
export default tasks.default;
