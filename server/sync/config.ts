/**
 * Sync server configuration from options and the environment.
 *
 *   DEWLINE_DB               SQLite file (default ./data/dewline.sqlite)
 *   DEWLINE_DB_SYNC          'full' (default: fsync on every commit) or 'normal' (WAL: survives a
 *                            process crash, may lose the last commits on power loss)
 *   DEWLINE_ALLOWED_ORIGINS  extra browser origins, comma-separated, or '*' (same origin is always allowed)
 *   DEWLINE_LOG_LEVEL        debug | info | warn | error (default info)
 *   DEWLINE_MAX_* ...        limits, see limits.ts
 */
import path from 'node:path';
import { resolveLimits, type Limits } from './limits';
import { isLogLevel, type LogLevel } from './log';
import { parseAllowedOrigins, type AllowedOrigins } from './origin';
import type { SyncMode } from './storage';

export interface SyncConfig {
  dbFile: string;
  dbSync: SyncMode;
  allowedOrigins: AllowedOrigins;
  logLevel: LogLevel;
  limits: Limits;
}

export interface SyncConfigOptions {
  dbFile?: string;
  dbSync?: SyncMode;
  allowedOrigins?: AllowedOrigins;
  logLevel?: LogLevel;
  limits?: Partial<Limits>;
}

export const defaultDbFile = path.join('data', 'dewline.sqlite');

export function resolveSyncConfig(opts: SyncConfigOptions = {}, env: NodeJS.ProcessEnv = process.env): SyncConfig {
  const dbSyncRaw = opts.dbSync ?? env.DEWLINE_DB_SYNC ?? 'full';
  if (dbSyncRaw !== 'full' && dbSyncRaw !== 'normal') throw new Error(`DEWLINE_DB_SYNC must be "full" or "normal", got ${JSON.stringify(dbSyncRaw)}`);
  const logLevel = opts.logLevel ?? env.DEWLINE_LOG_LEVEL ?? 'info';
  if (!isLogLevel(logLevel)) throw new Error(`DEWLINE_LOG_LEVEL must be debug, info, warn or error, got ${JSON.stringify(logLevel)}`);
  return {
    dbFile: path.resolve(opts.dbFile ?? (env.DEWLINE_DB || defaultDbFile)),
    dbSync: dbSyncRaw,
    allowedOrigins: opts.allowedOrigins ?? parseAllowedOrigins(env.DEWLINE_ALLOWED_ORIGINS),
    logLevel,
    limits: resolveLimits(opts.limits, env),
  };
}
