// Worker entry when the engine runs as TypeScript (tsx or vitest): registers tsx's loader in
// this thread, then loads worker.ts. Node 20 does not apply an `--import` loader from a
// worker's execArgv to the worker's own entry module, hence this file.
import { register } from 'tsx/esm/api';

register();
await import('./worker.ts');
