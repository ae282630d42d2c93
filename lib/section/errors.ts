/** Validation problems, each with the field path where it entered and the reason. */

export interface Problem {
  /** Field path such as `parts[3].thickness` ('' for the whole file). */
  path: string;
  message: string;
}

export class SectionError extends Error {
  readonly problems: readonly Problem[];
  constructor(problems: readonly Problem[]) {
    super(problems.map(formatProblem).join('\n'));
    this.name = 'SectionError';
    this.problems = problems;
  }
}

export function formatProblem(p: Problem): string {
  return p.path ? `${p.path}: ${p.message}` : p.message;
}

/** ['parts', 3, 'thickness'] -> 'parts[3].thickness' */
export function formatPath(path: readonly PropertyKey[]): string {
  let out = '';
  for (const seg of path) {
    if (typeof seg === 'number') out += `[${seg}]`;
    else out += out ? `.${String(seg)}` : String(seg);
  }
  return out;
}
