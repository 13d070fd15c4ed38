import { fileURLToPath } from 'node:url';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';
import { defineConfig } from 'vitest/config';

const sharedDir = fileURLToPath(new URL('./shared', import.meta.url));
const alias = { '@shared': sharedDir };

export default defineConfig({
  root: 'frontend',
  plugins: [react(), tailwindcss()],
  resolve: { alias },
  build: {
    outDir: fileURLToPath(new URL('./dist/client', import.meta.url)),
    emptyOutDir: true,
    chunkSizeWarningLimit: 1500,
    rollupOptions: {
      // shared/ is pure (no module does anything on import but declare): a page that takes one
      // function from a barrel does not load the rest of the core (the polygon clipper among it).
      treeshake: { moduleSideEffects: (id: string) => !id.startsWith(sharedDir) },
    },
  },
  worker: { format: 'es' },
  server: {
    port: 5173,
    // changeOrigin false keeps the browser's Host, so the API's same-origin check accepts the dev server.
    proxy: { '/api': { target: 'http://127.0.0.1:3000', changeOrigin: false } },
  },
  test: {
    root: '.',
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'unit',
          root: '.',
          include: ['tests/unit/**/*.test.ts', 'tests/reference/**/*.test.ts'],
          environment: 'node',
          // A ceiling against hangs, not a speed target: some property tests take seconds on a busy machine.
          testTimeout: 30000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'api',
          root: '.',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/globalSetup.ts'],
          testTimeout: 30000,
          hookTimeout: 60000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e',
          root: '.',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/globalSetup.ts'],
          testTimeout: 90000,
          hookTimeout: 120000,
          fileParallelism: false,
          // Polls wait for the page, which is slower while the other projects run beside it.
          expect: { poll: { timeout: 10000 } },
        },
      },
    ],
  },
});
