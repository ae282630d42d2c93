/**
 * `dewline validate [--write FILE]`: runs every validation case of lib/validation (ISO 10211
 * Annex A cases 1 and 2, ISO 6946 layered walls, ISO 13370 slab strips), prints the Markdown
 * table (case, source, reference, ours, difference, tolerance, pass) and, with --write, writes it
 * to FILE. Exit 0 when every case passes, 1 when any fails, 2 for bad arguments.
 */
import type { ValidationRow } from '../validation';
import { allValidationRows, validationMarkdown } from '../validation';
import type { CliIO } from './io';
import { EXIT } from './io';

const USAGE = 'usage: dewline validate [--write FILE]';

/** Exit status for a set of rows: 0 when all pass, 1 when any fails. */
export function validationExit(rows: readonly ValidationRow[]): number {
  return rows.length > 0 && rows.every((r) => r.pass) ? EXIT.ok : EXIT.internal;
}

export function parseValidateArgs(args: readonly string[]): { write: string | null } | { error: string } {
  let write: string | null = null;
  for (let i = 0; i < args.length; i++) {
    const a = args[i];
    if (a === '--write') {
      const f = args[i + 1];
      if (!f || f.startsWith('-')) return { error: `--write: needs a file name\n${USAGE}` };
      write = f;
      i++;
    } else return { error: `unknown argument '${a}'\n${USAGE}` };
  }
  return { write };
}

export function validateCommand(args: string[], io: CliIO): number {
  const parsed = parseValidateArgs(args);
  if ('error' in parsed) {
    io.err(parsed.error);
    return EXIT.badInput;
  }
  if (parsed.write && !io.writeFile) {
    io.err('dewline validate: --write is not available here (no file access)');
    return EXIT.badInput;
  }
  const rows = allValidationRows();
  const md = validationMarkdown(rows);
  io.out(md);
  if (parsed.write) io.writeFile!(parsed.write, md.endsWith('\n') ? md : md + '\n');
  const failed = rows.filter((r) => !r.pass);
  for (const r of failed) io.err(`FAIL ${r.group}: ${r.name}: ours ${r.ours}, reference ${r.reference}, difference ${r.difference} > ${r.tolerance}`);
  io.err(`${rows.length} validation checks, ${failed.length} failed${parsed.write ? `; table written to ${parsed.write}` : ''}`);
  return validationExit(rows);
}
