#!/usr/bin/env node
// npm test: every test. Unit, validation and integration tests (Vitest), then the browser tests
// (Playwright in Chromium against the built app). Ends with one summary line: "N passed, N failed".
//   --only unit | e2e     run one half
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { buildIfStale, root } from './build-if-stale.mjs';
import { CHROMIUM_MISSING, findChromium } from './find-chromium.mjs';

const only = process.argv.includes('--only') ? process.argv[process.argv.indexOf('--only') + 1] : null;
const outDir = path.join(root, 'test-results');
fs.mkdirSync(outDir, { recursive: true });
const totals = { passed: 0, failed: 0, skipped: 0 };
let broken = false;

const chromium = only === 'unit' ? null : findChromium();
if (only !== 'unit' && !chromium) {
  console.error(CHROMIUM_MISSING);
  process.exit(1);
}

function run(cmd, args, env = {}) {
  return spawnSync(cmd, args, { cwd: root, stdio: 'inherit', env: { ...process.env, ...env } });
}

if (only !== 'e2e') {
  const json = path.join(outDir, 'vitest.json');
  fs.rmSync(json, { force: true });
  const r = run(process.execPath, [path.join(root, 'node_modules/vitest/vitest.mjs'), 'run', '--reporter=default', '--reporter=json', `--outputFile.json=${json}`]);
  if (fs.existsSync(json)) {
    const rep = JSON.parse(fs.readFileSync(json, 'utf8'));
    totals.passed += rep.numPassedTests;
    totals.failed += rep.numFailedTests;
    totals.skipped += rep.numPendingTests + (rep.numTodoTests ?? 0);
    if (r.status !== 0 && rep.numFailedTests === 0) broken = true; // a file failed to load, say
  } else broken = true;
}

if (only !== 'unit' && fs.existsSync(path.join(root, 'playwright.config.ts'))) {
  if (buildIfStale() !== 0) broken = true;
  else {
    const json = path.join(outDir, 'playwright.json');
    fs.rmSync(json, { force: true });
    const r = run(process.execPath, [path.join(root, 'node_modules/@playwright/test/cli.js'), 'test', '--reporter=list,json'], { CHROMIUM_PATH: chromium, PLAYWRIGHT_JSON_OUTPUT_NAME: json });
    if (fs.existsSync(json)) {
      const s = JSON.parse(fs.readFileSync(json, 'utf8')).stats;
      totals.passed += s.expected + (s.flaky ?? 0);
      totals.failed += s.unexpected;
      totals.skipped += s.skipped;
      if (r.status !== 0 && s.unexpected === 0) broken = true;
    } else broken = true;
  }
}

if (broken) console.error('dewline: a test run did not complete (see above)');
console.log(`\nSummary: ${totals.passed} passed, ${totals.failed + (broken ? 1 : 0)} failed, ${totals.skipped} skipped`);
process.exit(totals.failed || broken ? 1 : 0);
