/** First-load JavaScript of the Dock (gzip) against a blank React page built the same way. */
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import { execFileSync } from 'node:child_process';
import type { BenchResult } from './lib';

const root = path.resolve(__dirname, '../../..');

/** Scripts the HTML loads at once (entry + modulepreload), gzip-compressed, in bytes. */
function firstLoadGzip(distDir: string): number {
  const html = fs.readFileSync(path.join(distDir, 'index.html'), 'utf8');
  const srcs = [...html.matchAll(/(?:src|href)="([^"]+\.js)"/g)].map((m) => m[1]);
  return srcs.reduce((sum, s) => sum + zlib.gzipSync(fs.readFileSync(path.join(distDir, s.replace(/^\//, '')))).length, 0);
}

export async function benchBundle(): Promise<BenchResult> {
  const ours = firstLoadGzip(path.join(root, 'dist/web'));
  const blankDir = fs.mkdtempSync('/tmp/yk-blank-');
  fs.writeFileSync(path.join(blankDir, 'index.html'), '<!doctype html><html><body><div id="root"></div><script type="module" src="/main.tsx"></script></body></html>');
  fs.writeFileSync(path.join(blankDir, 'main.tsx'), "import { createRoot } from 'react-dom/client';\ncreateRoot(document.getElementById('root')!).render(<p>blank</p>);\n");
  fs.writeFileSync(path.join(blankDir, 'vite.config.mjs'), `import react from '${path.join(root, 'node_modules/@vitejs/plugin-react/dist/index.js')}';\nexport default { root: '${blankDir}', plugins: [react()], logLevel: 'warn', build: { outDir: '${blankDir}/dist' }, resolve: { alias: { react: '${root}/node_modules/react', 'react-dom': '${root}/node_modules/react-dom' } } };\n`);
  execFileSync(path.join(root, 'node_modules/.bin/vite'), ['build', '--config', path.join(blankDir, 'vite.config.mjs')], { cwd: root, stdio: 'pipe' });
  const blank = firstLoadGzip(path.join(blankDir, 'dist'));
  fs.rmSync(blankDir, { recursive: true, force: true });
  const kb = ours / 1024;
  return {
    name: 'first-load JavaScript of the Dock (gzip)',
    floor: 'a blank React page built the same way',
    target: '≤ 250 KB',
    median: { oursKB: Math.round(kb * 10) / 10, blankKB: Math.round((blank / 1024) * 10) / 10 },
    p95: {},
    ratio: ours / blank,
    met: kb <= 250,
  };
}
