#!/usr/bin/env node
// The dewline command: runs the TypeScript sources through tsx (no build step).
import { register } from 'tsx/esm/api';

register();
await import('../lib/cli/node-main.ts');
