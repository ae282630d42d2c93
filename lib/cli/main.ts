/**
 * The command line, as a pure dispatcher over injected IO (the Node entry is ./node-main.ts).
 *   dewline templates            one template per line: name, then a short description
 *   dewline template NAME        the template as a section file on stdout
 *   dewline check FILE           validate and summarise
 *   dewline solve FILE [--json] [--mesh preview|default|fine]
 *   dewline validate [--write FILE]
 *   dewline render FILE --svg|--png [--out F] [--scale N] [--no-overlay]
 */
import { TEMPLATES, templateByName } from '../section/templates';
import { checkCommand } from './check';
import type { CliIO } from './io';
import { EXIT } from './io';

export const USAGE = `usage: dewline COMMAND
  templates                 list the templates (name, description)
  template NAME             print a template as a section file (JSON)
  check FILE                validate a section file and summarise it
  solve FILE [--json] [--mesh preview|default|fine]
                            solve a section: heat flows, psi, coldest surfaces, verdict
  validate [--write FILE]   run the published validation cases
  render FILE --svg|--png [--out F] [--scale N] [--no-overlay] [--units si|ip]
                            draw the section (scale 1:N, default 10) as SVG or PNG
Exit status: 0 success, 2 bad input, 1 internal error.`;

type Command = (args: string[], io: CliIO) => number | Promise<number>;

const COMMANDS: Record<string, Command> = {
  templates(_args, io) {
    const w = Math.max(...TEMPLATES.map((t) => t.name.length));
    for (const t of TEMPLATES) io.out(`${t.name.padEnd(w)}  ${t.description}`);
    return EXIT.ok;
  },
  template(args, io) {
    const name = args[0];
    const t = name ? templateByName(name) : undefined;
    if (!t) {
      io.err(name ? `unknown template '${name}'; known: ${TEMPLATES.map((x) => x.name).join(', ')}` : 'usage: dewline template NAME');
      return EXIT.badInput;
    }
    io.out(JSON.stringify(t.build(), null, 2));
    return EXIT.ok;
  },
  check: checkCommand,
  async solve(args, io) {
    // The solver's command module is optional in this build: a missing one is reported, not a crash.
    const mod = (await import('./solve').catch(() => null)) as { solveCommand?: Command } | null;
    if (!mod?.solveCommand) {
      io.err('dewline solve: not available in this build yet');
      return EXIT.internal;
    }
    return mod.solveCommand(args, io);
  },
  async render(args, io) {
    const { renderCommand } = await import('./render');
    return renderCommand(args, io);
  },
  async validate(args, io) {
    const mod = (await import(/* @vite-ignore */ './validate' + '').catch(() => null)) as { validateCommand?: Command } | null;
    if (!mod?.validateCommand) {
      io.err('dewline validate: not available in this build yet');
      return EXIT.internal;
    }
    return mod.validateCommand(args, io);
  },
};

export async function runCli(argv: string[], io: CliIO): Promise<number> {
  const [cmd, ...rest] = argv;
  if (!cmd || cmd === '--help' || cmd === '-h' || cmd === 'help') {
    (cmd ? io.out : io.err)(USAGE);
    return cmd ? EXIT.ok : EXIT.badInput;
  }
  const run = COMMANDS[cmd];
  if (!run) {
    io.err(`unknown command '${cmd}'\n${USAGE}`);
    return EXIT.badInput;
  }
  try {
    return await run(rest, io);
  } catch (e) {
    io.err(`dewline ${cmd}: internal error: ${(e as Error).stack ?? String(e)}`);
    return EXIT.internal;
  }
}
