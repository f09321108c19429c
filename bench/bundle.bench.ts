/** First-load JavaScript of the Dock (gzip) against a blank React page built the same way. */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { execFileSync } from 'node:child_process';
import { launchBrowser, signIn } from '../tests/support/browser';
import type { BenchResult } from './lib';

const root = path.resolve(__dirname, '../../..');
const gz = (file: string) => zlib.gzipSync(fs.readFileSync(file), { level: 9 }).length;

/** Gzip size of each script the page fetches while `visit` runs. */
async function scriptsDuring(visit: (page: import('playwright-core').Page) => Promise<void>, cookies: Parameters<import('playwright-core').BrowserContext['addCookies']>[0] = []): Promise<{ bytes: number; files: string[] }> {
  const cold = await launchBrowser();
  if (cookies.length > 0) await cold.addCookies(cookies);
  const page = cold.pages()[0] ?? (await cold.newPage());
  const scripts = new Set<string>();
  page.on('request', (r) => {
    if (r.resourceType() === 'script') scripts.add(new URL(r.url()).pathname);
  });
  await visit(page);
  await page.waitForLoadState('networkidle');
  await cold.close();
  const files = [...scripts];
  return { bytes: files.reduce((s, f) => s + gz(path.join(root, 'dist/web', f)), 0), files };
}

/**
 * Every script the browser fetches to show the Dock to a signed-in inspector on a cold cache
 * (entry, preloads and the route's lazy chunks), gzip-compressed: the session cookie of an
 * earlier sign-in is carried over, the cache is empty. Also the whole path from the sign-in
 * page to the Dock on a cold cache, reported beside it.
 */
async function dockScripts(base: string): Promise<{ dock: { bytes: number; files: string[] }; viaSignIn: { bytes: number; files: string[] } }> {
  const warm = await launchBrowser();
  const page = warm.pages()[0] ?? (await warm.newPage());
  await signIn(page, base, 'inspector@harrowgate.test');
  await page.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
  const cookies = await warm.cookies();
  await warm.close();
  const dock = await scriptsDuring(async (p) => {
    await p.goto(`${base}/dock`);
    await p.getByRole('heading', { name: 'Dock' }).waitFor();
  }, cookies);
  const viaSignIn = await scriptsDuring(async (p) => {
    await signIn(p, base, 'inspector@harrowgate.test');
    await p.waitForURL((u) => !u.pathname.startsWith('/sign-in'));
    await p.goto(`${base}/dock`);
    await p.getByRole('heading', { name: 'Dock' }).waitFor();
  });
  return { dock, viaSignIn };
}

function blankReactGzip(): number {
  const dir = fs.mkdtempSync('/tmp/yk-blank-');
  fs.writeFileSync(path.join(dir, 'index.html'), '<!doctype html><html><body><div id="root"></div><script type="module" src="/main.tsx"></script></body></html>');
  fs.writeFileSync(path.join(dir, 'main.tsx'), "import { createRoot } from 'react-dom/client';\ncreateRoot(document.getElementById('root')!).render(<p>blank</p>);\n");
  fs.writeFileSync(
    path.join(dir, 'vite.config.mjs'),
    `import react from '${path.join(root, 'node_modules/@vitejs/plugin-react/dist/index.js')}';\nexport default { root: '${dir}', plugins: [react()], logLevel: 'warn', build: { outDir: '${dir}/dist' }, resolve: { alias: { react: '${root}/node_modules/react', 'react-dom': '${root}/node_modules/react-dom' } } };\n`,
  );
  execFileSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--config', path.join(dir, 'vite.config.mjs')], { cwd: root, stdio: 'pipe' });
  const html = fs.readFileSync(path.join(dir, 'dist/index.html'), 'utf8');
  const bytes = [...html.matchAll(/(?:src|href)="([^"]+\.js)"/g)].reduce((s, m) => s + gz(path.join(dir, 'dist', m[1])), 0);
  fs.rmSync(dir, { recursive: true, force: true });
  return bytes;
}

export async function benchBundle(base: string): Promise<BenchResult> {
  const { dock: ours, viaSignIn } = await dockScripts(base);
  const blank = blankReactGzip();
  const kb = ours.bytes / 1024;
  return {
    name: 'first-load JavaScript of the Dock (gzip)',
    floor: 'a blank React page built the same way',
    target: '≤ 250 KB',
    median: { oursKB: Math.round(kb * 10) / 10, blankKB: Math.round((blank / 1024) * 10) / 10, signInThenDockKB: Math.round((viaSignIn.bytes / 1024) * 10) / 10 },
    p95: {},
    ratio: ours.bytes / blank,
    met: kb <= 250,
    extra: { files: ours.files, signInThenDockFiles: viaSignIn.files },
    notes: `sign-in page then the Dock on a cold cache: ${Math.round(viaSignIn.bytes / 1024)} KB`,
  };
}
