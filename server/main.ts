/**
 * One Node process: serves the Next.js app and (from the rooms work on) the sync endpoint on one port.
 * Usage: tsx server/main.ts [--dev]   (PORT and HOST from the environment; defaults 3000 and 0.0.0.0)
 */
import http from 'node:http';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import next from 'next';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

export async function startServer(opts: { dev: boolean; port: number; host: string }) {
  const app = next({ dev: opts.dev, dir: root, hostname: opts.host, port: opts.port });
  await app.prepare();
  const handle = app.getRequestHandler();
  const server = http.createServer((req, res) => {
    if (req.url === '/healthz') {
      res.writeHead(200, { 'content-type': 'application/json' });
      res.end(JSON.stringify({ ok: true }));
      return;
    }
    void handle(req, res);
  });
  if (opts.dev) {
    const upgrade = app.getUpgradeHandler();
    server.on('upgrade', (req, socket, head) => void upgrade(req, socket, head));
  }
  await new Promise<void>((resolve) => server.listen(opts.port, opts.host, resolve));
  return server;
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const dev = process.argv.includes('--dev');
  const port = Number(process.env.PORT ?? 3000);
  const host = process.env.HOST ?? '0.0.0.0';
  startServer({ dev, port, host }).then(
    () => console.error(JSON.stringify({ msg: 'listening', url: `http://localhost:${port}`, dev })),
    (err) => {
      console.error(err);
      process.exit(1);
    },
  );
}
