/**
 * `dewline validate` as a person runs it: exit status, the Markdown table, and docs/validation.md
 * up to date with what the command generates (the file has no timestamp, so it must match exactly).
 */
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseValidateArgs, validationExit } from '../../lib/cli/validate';
import { VALIDATION_GROUPS } from '../../lib/validation';
import { absRow } from '../../lib/validation/row';

const root = path.resolve(__dirname, '../..');
const run = (...args: string[]) => spawnSync(process.execPath, [path.join(root, 'bin/dewline.mjs'), ...args], { cwd: root, encoding: 'utf8', maxBuffer: 1 << 26 });
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-validate-'));

describe('dewline validate', () => {
  it('passes every case, prints the table, writes the file, and docs/validation.md is up to date', () => {
    const file = path.join(dir, 'validation.md');
    const r = run('validate', '--write', file);
    expect(r.status, r.stderr).toBe(0);
    expect(r.stdout).toMatch(/\| case \| source \| reference \| ours \| difference \| tolerance \| pass \|/);
    expect(r.stdout).not.toMatch(/\*\*no\*\*/);
    for (const g of ['ISO 10211 Annex A case 1', 'ISO 10211 Annex A case 2', 'ISO 6946 layered wall', 'ISO 13370 slab on ground']) expect(r.stdout).toContain(`## ${g}`);
    expect(r.stderr).toMatch(/validation checks, 0 failed/);
    const written = fs.readFileSync(file, 'utf8');
    expect(written).toMatch(/do not edit by hand/i);
    // Every group states its mesh; the ISO 10211 and ISO 13370 ones are explicit, not built-in levels.
    for (const g of VALIDATION_GROUPS) expect(written).toContain(`## ${g.title}\n\nMesh: `);
    expect(written).toMatch(/## ISO 10211 Annex A case 2\n\nMesh: explicit: first cell 0.5 mm/);
    // 28 points of case 1 plus 4 tabulated, Phi and A-I of case 2.
    expect(written.match(/^\| T\(/gm)?.length).toBe(32);
    expect(written.match(/^\| T at [A-I] /gm)?.length).toBe(9);
    const committed = fs.readFileSync(path.join(root, 'docs/validation.md'), 'utf8');
    expect(committed, 'docs/validation.md is stale: run npm run validate').toBe(written);
  }, 180_000);

  it('refuses bad arguments with exit 2', () => {
    const a = run('validate', '--write');
    expect(a.status).toBe(2);
    expect(a.stderr).toMatch(/--write: needs a file name/);
    const b = run('validate', '--bogus');
    expect(b.status).toBe(2);
    expect(b.stderr).toMatch(/unknown argument '--bogus'/);
    expect(parseValidateArgs(['--write', 'x.md'])).toEqual({ write: 'x.md' });
  });

  it('exits 1 when any row fails, 0 when all pass', () => {
    const ok = absRow('g', 'within', 'test', 1, 1.05, 0.1, 'C');
    const bad = absRow('g', 'outside', 'test', 1, 1.2, 0.1, 'C');
    expect(ok.pass).toBe(true);
    expect(bad.pass).toBe(false);
    expect(validationExit([ok])).toBe(0);
    expect(validationExit([ok, bad])).toBe(1);
    expect(validationExit([])).toBe(1);
  });
});
