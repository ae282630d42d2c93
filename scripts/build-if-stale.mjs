// Build the Next.js app when .next is missing or older than the sources. Shared by npm start and npm test.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';

export const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

function newest(p) {
  if (!fs.existsSync(p)) return 0;
  const st = fs.statSync(p);
  if (!st.isDirectory()) return st.mtimeMs;
  let n = 0;
  for (const e of fs.readdirSync(p)) if (!e.endsWith('.test.ts')) n = Math.max(n, newest(path.join(p, e)));
  return n;
}

export function buildIfStale({ force = false } = {}) {
  const buildId = path.join(root, '.next', 'BUILD_ID');
  const sources = Math.max(...['app', 'components', 'lib', 'next.config.js', 'package.json', 'tsconfig.json'].map((p) => newest(path.join(root, p))));
  const stale = force || !fs.existsSync(buildId) || fs.statSync(buildId).mtimeMs < sources;
  if (!stale) return 0;
  console.error('dewline: building the app (first run or sources changed)...');
  const r = spawnSync(process.execPath, [path.join(root, 'node_modules/next/dist/bin/next'), 'build'], { cwd: root, stdio: 'inherit' });
  return r.status ?? 1;
}

// `node scripts/build-if-stale.mjs`: build when stale, exit with the build's status.
if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) process.exit(buildIfStale());
