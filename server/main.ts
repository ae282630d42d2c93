/**
 * One Node process: serves the Next.js app and the sync endpoint (rooms) on one port.
 * Usage: tsx server/main.ts [--dev]   (PORT and HOST from the environment; defaults 3000 and 0.0.0.0;
 * the sync server's settings (DEWLINE_DB, limits, origins) are read from the environment too, see docs/rooms.md)
 *
 * Requests: /healthz and /api/rooms..., /api/keys/... go to the sync server, everything else to Next.
 * Upgrades: /sync/<key> go to the sync server; in dev mode every other upgrade goes to Next (hot reload).
 */
import http from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import next from 'next';
import { createSyncServer, type SyncServer, type SyncServerOptions } from './sync/index';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export async function startServer(opts: { dev: boolean; port: number; host: string; sync?: SyncServerOptions }) {
  const app = next({ dev: opts.dev, dir: root, hostname: opts.host, port: opts.port });
  await app.prepare();
  const handle = app.getRequestHandler();
  const sync: SyncServer = createSyncServer(opts.sync);
  const server = http.createServer((req, res) => {
    if (sync.handleRequest(req, res)) return;
    void handle(req, res);
  });
  const nextUpgrade = opts.dev ? app.getUpgradeHandler() : null;
  server.on('upgrade', (req, socket, head) => {
    if (sync.handleUpgrade(req, socket, head)) return;
    if (nextUpgrade) void nextUpgrade(req, socket, head);
    else socket.destroy();
  });
  server.on('close', () => void sync.close());
  await new Promise<void>((resolve) => server.listen(opts.port, opts.host, resolve));
  return server;
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const dev = process.argv.includes('--dev');
  const port = Number(process.env.PORT ?? 3000);
  const host = process.env.HOST ?? '0.0.0.0';
  startServer({ dev, port, host }).then(
    (server) => {
      console.error(JSON.stringify({ msg: 'listening', url: `http://localhost:${port}`, dev }));
      const stop = () => server.close(() => process.exit(0));
      process.on('SIGTERM', stop);
      process.on('SIGINT', stop);
    },
    (err) => {
      console.error(err);
      process.exit(1);
    },
  );
}
