// End-to-end helpers: the real server (migrated, demo seeded) on a fresh database, and Debian's Chromium.
import { mkdirSync } from 'node:fs';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { startServer, type RunningServer } from '../../backend/src/server';
import { createTestDb, testConfig, type TestDb } from './testApp';

export const SCREENS = path.resolve('tests/.output/screens');

export interface E2e {
  server: RunningServer;
  db: TestDb;
  browser: Browser;
  close(): Promise<void>;
}

/** Starts the server on a free port with the demo seeded, and a headless Chromium. */
export async function startE2e(): Promise<E2e> {
  const db = await createTestDb();
  const server = await startServer(testConfig({ PORT: '0' }), db.url, { quiet: true });
  const browser = await chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    args: ['--headless', '--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
  });
  mkdirSync(SCREENS, { recursive: true });
  return {
    server,
    db,
    browser,
    async close() {
      await browser.close();
      await server.close();
      await db.drop();
    },
  };
}

/** Signs in through the page; waits for the app frame. */
export async function signInPage(page: Page, baseUrl: string, email: string, password = 'ringfence-demo'): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('button', { name: 'Sign out' }).waitFor();
}
