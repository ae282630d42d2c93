#!/usr/bin/env node
// npm start: build the app if needed, then serve pages and sync on one port (PORT, default 3000).
import { spawnSync } from 'node:child_process';
import path from 'node:path';
import { buildIfStale, root } from './build-if-stale.mjs';

const built = buildIfStale({ force: process.env.DEWLINE_REBUILD === '1' });
if (built !== 0) process.exit(built);
const r = spawnSync(process.execPath, [path.join(root, 'node_modules/tsx/dist/cli.mjs'), path.join(root, 'server/main.ts')], {
  cwd: root,
  stdio: 'inherit',
  env: { ...process.env, NODE_ENV: 'production' },
});
process.exit(r.status ?? 1);
