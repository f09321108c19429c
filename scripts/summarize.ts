/**
 * Adds the checks (lint, type-check) to vitest's JSON report and prints the closing line
 * `N passed, N failed`. Usage: node summarize.js <vitest.json> <checks.txt>
 * checks.txt holds one `name pass|fail` per line.
 */
import fs from 'node:fs';

interface VitestJson {
  numPassedTests?: number;
  numFailedTests?: number;
  numPendingTests?: number;
  numTotalTests?: number;
  testResults?: { status: string; message?: string; name: string }[];
}

const [jsonFile, checksFile] = process.argv.slice(2);
let passed = 0;
let failed = 0;
let skipped = 0;
if (checksFile && fs.existsSync(checksFile)) {
  for (const line of fs.readFileSync(checksFile, 'utf8').split('\n').filter(Boolean)) {
    if (line.endsWith(' pass')) passed++;
    else {
      failed++;
      console.log(`check failed: ${line}`);
    }
  }
}
if (jsonFile && fs.existsSync(jsonFile)) {
  const r = JSON.parse(fs.readFileSync(jsonFile, 'utf8')) as VitestJson;
  passed += r.numPassedTests ?? 0;
  failed += r.numFailedTests ?? 0;
  skipped += r.numPendingTests ?? 0;
  // A test file that failed to load counts as a failure even with no test inside it.
  for (const f of r.testResults ?? []) {
    if (f.status === 'failed' && f.message) {
      failed++;
      console.log(`file failed: ${f.name}: ${f.message.split('\n')[0]}`);
    }
  }
} else {
  failed++;
  console.log('no test report was written');
}
console.log(`${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}`);
process.exit(failed > 0 || passed === 0 ? 1 : 0);
