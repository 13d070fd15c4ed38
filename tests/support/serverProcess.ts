// The real server in a process of its own: for tests that take its database away under it, and for
// the load benchmark (so the load generator does not share the server's event loop).
// Prints "READY <url>" once it listens; the parent reads the rest of the output as its log.
import { loadConfig } from '../../backend/src/config';
import { startServer } from '../../backend/src/server';

const url = process.env.DATABASE_URL;
if (!url) throw new Error('serverProcess: DATABASE_URL is not set');
const config = loadConfig({ ...process.env, NODE_ENV: 'test', PORT: '0', BCRYPT_COST: '4' });
const running = await startServer(config, url, { clientDir: '/nonexistent', say: (m) => console.log(m) });
console.log(`READY ${running.url}`);
process.on('SIGTERM', () => {
  running.close().finally(() => process.exit(0));
});
