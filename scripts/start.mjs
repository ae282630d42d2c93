#!/usr/bin/env node
// npm start: build the app when the build is missing or older than the sources, then serve it
// (pages and sync on one port). PORT overrides 3000.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const buildId = path.join(root, '.next', 'BUILD_ID');

function newestSource(dir) {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestSource(p));
    else newest = Math.max(newest, fs.statSync(p).mtimeMs);
  }
  return newest;
}

const sources = ['app', 'components', 'lib', 'next.config.js', 'package.json'].map((p) => path.join(root, p));
const newest = Math.max(...sources.filter((p) => fs.existsSync(p)).map((p) => (fs.statSync(p).isDirectory() ? newestSource(p) : fs.statSync(p).mtimeMs)));
const stale = !fs.existsSync(buildId) || fs.statSync(buildId).mtimeMs < newest || process.env.DEWLINE_REBUILD === '1';
if (stale) {
  console.error('dewline: building the app (first start or sources changed)...');
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules/next/dist/bin/next'), 'build'], { cwd: root, stdio: 'inherit' });
  if (r.status !== 0) process.exit(r.status ?? 1);
}
const r = spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'server/main.ts')], { cwd: root, stdio: 'inherit', env: { ...process.env, NODE_ENV: 'production' } });
process.exit(r.status ?? 1);
