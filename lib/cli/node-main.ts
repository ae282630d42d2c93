/** Node entry of the command line: real streams and files. */
import fs from 'node:fs';
import { runCli } from './main';

const io = {
  out: (s: string) => process.stdout.write(s.endsWith('\n') ? s : s + '\n'),
  err: (s: string) => process.stderr.write(s.endsWith('\n') ? s : s + '\n'),
  readFile: (p: string) => fs.readFileSync(p, 'utf8'),
  writeFile: (p: string, data: string | Uint8Array) => fs.writeFileSync(p, data),
};

runCli(process.argv.slice(2), io).then(
  (code) => {
    process.exitCode = code;
  },
  (e) => {
    process.stderr.write(`dewline: internal error: ${String(e)}\n`);
    process.exitCode = 1;
  },
);
