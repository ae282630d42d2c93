/**
 * Structured logs: one JSON object per line on stderr (or any writable).
 * Room keys must never reach a log line; callers pass `keyTag(key)` (see keys.ts) instead.
 */
export type LogLevel = 'debug' | 'info' | 'warn' | 'error';

export type LogFields = Record<string, string | number | boolean | null | undefined>;

export interface Logger {
  debug(msg: string, fields?: LogFields): void;
  info(msg: string, fields?: LogFields): void;
  warn(msg: string, fields?: LogFields): void;
  error(msg: string, fields?: LogFields): void;
}

const levelRank: Record<LogLevel, number> = { debug: 10, info: 20, warn: 30, error: 40 };

export function isLogLevel(value: unknown): value is LogLevel {
  return typeof value === 'string' && value in levelRank;
}

/** The JSON line for one log record (pure; exported for tests). */
export function formatLogLine(level: LogLevel, msg: string, fields: LogFields = {}, now = new Date()): string {
  return JSON.stringify({ t: now.toISOString(), level, msg, ...fields }) + '\n';
}

export function createLogger(opts: { level?: LogLevel; write?: (line: string) => void } = {}): Logger {
  const min = levelRank[opts.level ?? 'info'];
  const write = opts.write ?? ((line: string) => void process.stderr.write(line));
  const at = (level: LogLevel) => (msg: string, fields?: LogFields) => {
    if (levelRank[level] >= min) write(formatLogLine(level, msg, fields));
  };
  return { debug: at('debug'), info: at('info'), warn: at('warn'), error: at('error') };
}

/** A logger that drops everything (for embedding where logs are unwanted). */
export const silentLogger: Logger = { debug() {}, info() {}, warn() {}, error() {} };
