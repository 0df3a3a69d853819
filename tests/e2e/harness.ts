/**
 * Browser-test harness: builds the web export if stale, starts the real server on a free port with
 * a temporary database, and opens Debian's Chromium through playwright-core (never a downloaded
 * browser). Screenshots go to tests/e2e/screenshots/ (ignored by git) for people to look at.
 */
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { loadConfig } from '@/server/config';
import { startServer, type RunningServer } from '@/server/start';
import { ensureWebExport } from '@/server/web/build';

export const ROOT = path.resolve(__dirname, '../..');
export const SCREENSHOTS = path.join(ROOT, 'tests/e2e/screenshots');
export const DEMO_PASSWORD = 'e2e-demo-password-2026';

export const VIEWPORTS = {
  phone: { width: 390, height: 844 },
  wide: { width: 1280, height: 800 },
} as const;
export type ViewportName = keyof typeof VIEWPORTS;

export interface Harness {
  server: RunningServer;
  browser: Browser;
  close(): Promise<void>;
}

const CHROMIUM_ARGS = [
  '--headless',
  '--no-sandbox',
  '--disable-gpu',
  '--disable-quic',
  '--no-first-run',
  '--disable-background-networking',
  '--disable-component-update',
  '--disable-sync',
];

export async function startHarness(): Promise<Harness> {
  const webDir = path.join(ROOT, 'dist/web');
  ensureWebExport(ROOT, webDir, (m) => console.log(m));
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'plumbline-e2e-'));
  const config = loadConfig(
    {
      PORT: '0',
      FAKE_SMTP_PORT: '0',
      DATA_DIR: dataDir,
      WEB_DIR: webDir,
      LOG_LEVEL: 'silent',
      DEMO_PASSWORD,
    },
    ROOT,
  );
  const server = await startServer(config);
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: CHROMIUM_ARGS });
  fs.mkdirSync(SCREENSHOTS, { recursive: true });
  return {
    server,
    browser,
    async close() {
      await browser.close();
      await server.close();
      fs.rmSync(dataDir, { recursive: true, force: true });
    },
  };
}

/** A page at a viewport that records console errors and uncaught exceptions. */
export async function openPage(h: Harness, viewport: ViewportName) {
  const context = await h.browser.newContext({ viewport: VIEWPORTS[viewport], baseURL: h.server.url });
  const page = await context.newPage();
  const problems: string[] = [];
  page.on('console', (m) => {
    if (m.type() === 'error') problems.push(`console: ${m.text()}`);
  });
  page.on('pageerror', (e) => problems.push(`page error: ${e.message}`));
  return { page, problems, close: () => context.close() };
}

export async function signIn(page: Page, email: string, password = DEMO_PASSWORD) {
  await page.goto('/');
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

export function screenshot(page: Page, name: string) {
  return page.screenshot({ path: path.join(SCREENSHOTS, `${name}.png`), fullPage: true });
}

export function expect(condition: unknown, message: string): asserts condition {
  if (!condition) throw new Error(message);
}
