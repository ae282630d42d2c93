/**
 * The sync server alone (no Next): for integration tests, the benchmark and scripts.
 * Usage: tsx server/sync-main.ts [--port N] [--host H] [--db FILE]
 *   PORT / HOST / DEWLINE_DB from the environment otherwise; port 0 picks a free port.
 * Prints one JSON line on stdout once listening: {"port":N,"pid":P}
 */
import http from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import type { AddressInfo } from 'node:net';
import { createSyncServer, type SyncServerOptions } from './sync/index';

export async function startSyncServer(opts: { port: number; host: string } & SyncServerOptions) {
  const sync = createSyncServer(opts);
  const server = http.createServer();
  sync.attach(server);
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(opts.port, opts.host, resolve);
  });
  const port = (server.address() as AddressInfo).port;
  return {
    server,
    sync,
    port,
    async close() {
      await sync.close();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}

function flag(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const port = Number(flag('--port') ?? process.env.PORT ?? 0);
  const host = flag('--host') ?? process.env.HOST ?? '127.0.0.1';
  const dbFile = flag('--db');
  if (!Number.isInteger(port) || port < 0 || port > 65535) {
    console.error(`sync-main: --port must be an integer 0..65535, got ${port}`);
    process.exit(2);
  }
  startSyncServer({ port, host, dbFile }).then(
    (s) => {
      process.stdout.write(JSON.stringify({ port: s.port, pid: process.pid }) + '\n');
      const stop = () => void s.close().then(() => process.exit(0));
      process.on('SIGTERM', stop);
      process.on('SIGINT', stop);
    },
    (err) => {
      console.error(err);
      process.exit(1);
    },
  );
}
