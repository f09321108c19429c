import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const ARTIFACTS = path.resolve(__dirname, '../artifacts');

/** Debian's Chromium, headless, with the flags this closed network needs. Downloads nothing. */
export async function launchBrowser(opts: { width?: number; height?: number } = {}): Promise<BrowserContext> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'yokeline-chromium-'));
  const ctx = await chromium.launchPersistentContext(dir, {
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    viewport: { width: opts.width ?? 1280, height: opts.height ?? 800 },
    args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync', '--disable-dev-shm-usage'],
  });
  const close = ctx.close.bind(ctx);
  ctx.close = async () => {
    await close();
    fs.rmSync(dir, { recursive: true, force: true });
  };
  return ctx;
}

export async function screenshot(page: Page, name: string): Promise<string> {
  fs.mkdirSync(ARTIFACTS, { recursive: true });
  const file = path.join(ARTIFACTS, `${name}.png`);
  await page.screenshot({ path: file, fullPage: true });
  return file;
}

/** Records every request the page makes, so a test can prove none leaves loopback. */
export function watchRequests(page: Page): string[] {
  const urls: string[] = [];
  page.on('request', (r) => urls.push(r.url()));
  return urls;
}

export function isLoopback(url: string): boolean {
  if (url.startsWith('data:') || url.startsWith('blob:') || url === 'about:blank') return true;
  const host = new URL(url).hostname;
  return host === '127.0.0.1' || host === 'localhost' || host === '[::1]' || host.startsWith('127.');
}

export async function signIn(page: Page, baseUrl: string, email: string, password = 'yokeline-demo'): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password').fill(password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}
