/** What a command may touch: streams and file reading, injected so commands stay pure and testable. */
export interface CliIO {
  out(s: string): void;
  err(s: string): void;
  readFile(path: string): string;
  /** Write a text file (the Node entry provides it; commands that write say so when it is missing). */
  writeFile?(path: string, text: string): void;
}

/** Exit codes: 0 success, 1 internal error, 2 bad input. */
export const EXIT = { ok: 0, internal: 1, badInput: 2 } as const;
