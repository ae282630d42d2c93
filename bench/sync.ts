/**
 * npm run bench:sync — propagation latency of edits in one room, on loopback only.
 *
 * Starts the real sync server (server/sync-main.ts) as a child process on 127.0.0.1 with a temporary
 * SQLite file (default settings: WAL, synchronous=FULL), then for 2, 10 and 50 clients: creates a room,
 * writes a template section into it, connects that many stock y-websocket clients (WebSocketPolyfill:
 * ws), and lets every client make 5 edits a second (a part's field changed, as a drag or a typed value
 * does) for a fixed time. Each edit carries its send time; every other client records when it arrived.
 * Prints p50/p95/p99/max of edit -> arrival at the other clients, server CPU time per stored update and
 * server memory. Bounded: fixed count of edits per run, a hard time limit, then it stops by itself.
 *
 * The simulated people run in --procs child processes (default 2), so that one event loop decoding
 * every client's incoming updates is not what is measured; stamps use performance.timeOrigin + now(),
 * one clock for all processes on this machine.
 *
 * Options: --seconds N (edit time per run, default 10), --clients 2,10,50, --procs 2
 */
import { fork, spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import WebSocket from 'ws';
import * as Y from 'yjs';
import type { WebsocketProvider } from 'y-websocket';
import { createRoom } from '../lib/collab/api';
import { joinRoom } from '../lib/collab/provider';
import { writeSnapshot } from '../lib/section/doc';
import { templateByName } from '../lib/section/templates/index';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const EDITS_PER_SECOND = 5;
const TARGET_P99_MS = 100;
const HARD_LIMIT_MS = 10 * 60_000;

function flag(name: string): string | undefined {
  const i = process.argv.indexOf(name);
  return i >= 0 ? process.argv[i + 1] : undefined;
}
const seconds = Number(flag('--seconds') ?? 10);
const counts = (flag('--clients') ?? '2,10,50').split(',').map(Number);
const procs = Number(flag('--procs') ?? 2);
if (!(seconds > 0 && seconds <= 120) || counts.some((n) => !Number.isInteger(n) || n < 2 || n > 100) || !(Number.isInteger(procs) && procs >= 1 && procs <= 8)) {
  console.error('bench:sync: --seconds must be in (0, 120], --clients a list of integers 2..100, --procs 1..8');
  process.exit(2);
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
async function waitFor(what: string, cond: () => boolean, ms = 30_000) {
  const t0 = Date.now();
  while (!cond()) {
    if (Date.now() - t0 > ms) throw new Error(`timed out waiting for ${what}`);
    await sleep(5);
  }
}

/** utime + stime of a process in ms, from /proc (Linux); null elsewhere. */
function cpuMs(pid: number): number | null {
  try {
    const f = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    const rest = f.slice(f.lastIndexOf(')') + 2).split(' ');
    const ticks = Number(rest[11]) + Number(rest[12]);
    return (ticks * 1000) / 100; // USER_HZ is 100 on Linux
  } catch {
    return null;
  }
}
function rssMiB(pid: number): number | null {
  try {
    const m = /VmRSS:\s+(\d+) kB/.exec(fs.readFileSync(`/proc/${pid}/status`, 'utf8'));
    return m ? Number(m[1]) / 1024 : null;
  } catch {
    return null;
  }
}

async function startServer(dbFile: string): Promise<{ child: ChildProcess; port: number }> {
  // extra node flags for the server only, e.g. DEWLINE_BENCH_SERVER_NODE_ARGS='--cpu-prof --cpu-prof-dir=/tmp/prof'
  const extra = (process.env.DEWLINE_BENCH_SERVER_NODE_ARGS ?? '').split(' ').filter(Boolean);
  const child = spawn(process.execPath, [...extra, '--import', 'tsx', path.join(root, 'server/sync-main.ts'), '--port', '0', '--host', '127.0.0.1', '--db', dbFile], {
    cwd: root,
    env: { ...process.env, DEWLINE_LOG_LEVEL: 'warn', DEWLINE_API_REQUESTS_PER_MINUTE: '1000' },
    stdio: ['ignore', 'pipe', 'inherit'],
  });
  const port = await new Promise<number>((resolve, reject) => {
    let out = '';
    child.stdout!.on('data', (d) => {
      out += d;
      if (out.includes('\n')) resolve((JSON.parse(out.split('\n')[0]) as { port: number }).port);
    });
    child.once('exit', (code) => reject(new Error(`server exited (${code}) before listening`)));
  });
  return { child, port };
}

function percentile(sorted: Float64Array, p: number): number {
  if (sorted.length === 0) return NaN;
  const i = Math.min(sorted.length - 1, Math.max(0, Math.ceil((p / 100) * sorted.length) - 1));
  return sorted[i];
}

interface RunResult {
  clients: number;
  procs: number;
  serverCpuShare: number | null;
  clientCpuShare: number;
  edits: number;
  expected: number;
  received: number;
  p50: number;
  p95: number;
  p99: number;
  max: number;
  serverCpuPerUpdateMs: number | null;
  serverRssMiB: number | null;
  /** the same edits as seen by one more client alone in this (otherwise idle) process */
  observer: { received: number; p50: number; p95: number; p99: number; max: number };
}

/** Absolute time in ms with sub-ms resolution, comparable between processes on this machine. */
const nowAbs = () => performance.timeOrigin + performance.now();

interface WorkerJob {
  editKey: string;
  wsBase: string;
  /** global client indices this process runs */
  clients: number[];
  total: number;
  editsPerClient: number;
  partIds: string[];
}

/** One process of simulated people: connects its clients, makes their edits, records arrivals. */
async function workerMain(): Promise<void> {
  process.setMaxListeners(200); // y-websocket adds one 'exit' listener per provider in Node
  const job = await new Promise<WorkerJob>((resolve) => process.once('message', (m) => resolve(m as WorkerJob)));
  const expected = job.clients.length * (job.total - 1) * job.editsPerClient;
  const latencies = new Float64Array(expected);
  let received = 0;
  let measuring = false;
  const docs: Y.Doc[] = [];
  const providers: WebsocketProvider[] = [];
  for (const i of job.clients) {
    const doc = new Y.Doc();
    const provider = joinRoom(doc, job.editKey, { syncUrl: job.wsBase, WebSocketPolyfill: WebSocket as unknown as typeof globalThis.WebSocket });
    docs.push(doc);
    providers.push(provider);
    const me = `c${i}:`;
    // every edit writes its stamp [sender, seq, sentAt] under its own key 'c<sender>:<seq>' in 'bench', in the same transaction as the part change
    doc.getMap<readonly [number, number, number]>('bench').observe((ev) => {
      if (!measuring || ev.transaction.local) return;
      const now = nowAbs();
      for (const key of ev.keysChanged) {
        if (key.startsWith(me)) continue;
        const stamp = ev.target.get(key);
        if (!stamp || received >= expected) continue;
        latencies[received++] = now - stamp[2];
      }
    });
  }
  await waitFor('clients synced', () => providers.every((p) => p.synced) && docs.every((d) => d.getMap('parts').size === job.partIds.length), 60_000);
  process.send!({ type: 'ready' });
  const go = await new Promise<{ startAt: number }>((resolve) => process.once('message', (m) => resolve(m as { startAt: number })));
  measuring = true;
  const period = 1000 / EDITS_PER_SECOND;
  await Promise.all(
    docs.map(async (doc, k) => {
      const i = job.clients[k];
      const phase = Math.random() * period; // people are not in step
      for (let seq = 0; seq < job.editsPerClient; seq++) {
        const wait = go.startAt + phase + seq * period - nowAbs();
        if (wait > 0) await sleep(wait);
        const part = doc.getMap<Y.Map<unknown>>('parts').get(job.partIds[(i + seq) % job.partIds.length])!;
        doc.transact(() => {
          part.set('x', Math.round(((i * 7 + seq) % 50) * 10) / 1000);
          // a key per edit: the server may merge several edits into one message, and each must be seen
          doc.getMap('bench').set(`c${i}:${seq}`, [i, seq, nowAbs()] as const);
        });
      }
    }),
  );
  const tail = performance.now();
  while (received < expected && performance.now() - tail < 5_000) await sleep(20);
  measuring = false;
  const cpu = process.cpuUsage();
  for (const p of providers) p.destroy();
  // leave only when the parent has the report (it says 'bye'), so 'exit' never overtakes the report
  const bye = new Promise((resolve) => process.once('message', resolve));
  process.send!({ type: 'done', received, expected, latencies: Array.from(latencies.subarray(0, received)), cpuMs: (cpu.user + cpu.system) / 1000 });
  await bye;
  process.exit(0);
}

async function run(n: number, procs: number, base: string, wsBase: string, pid: number): Promise<RunResult> {
  const { editKey } = await createRoom(base);
  const tpl = templateByName('slab-edge-break')!.build();
  const partIds = tpl.parts.map((p) => p.id);
  const editsPerClient = Math.round(seconds * EDITS_PER_SECOND);
  // the section goes in first, from a client that then leaves
  {
    const doc = new Y.Doc();
    const p = joinRoom(doc, editKey, { syncUrl: wsBase, WebSocketPolyfill: WebSocket as unknown as typeof globalThis.WebSocket });
    await waitFor('writer synced', () => p.synced);
    writeSnapshot(doc, tpl, 'bench');
    await sleep(300);
    p.destroy();
    doc.destroy();
  }
  const k = Math.min(procs, n);
  const groups: number[][] = Array.from({ length: k }, () => []);
  for (let i = 0; i < n; i++) groups[i % k].push(i);
  // one more real client, alone in this process, that only watches: its latency leaves out the
  // queueing of the simulated people's own processes on a shared machine
  const obsDoc = new Y.Doc();
  const obs = joinRoom(obsDoc, editKey, { syncUrl: wsBase, WebSocketPolyfill: WebSocket as unknown as typeof globalThis.WebSocket });
  const obsLat = new Float64Array(n * editsPerClient);
  let obsReceived = 0;
  let obsOn = false;
  obsDoc.getMap<readonly [number, number, number]>('bench').observe((ev) => {
    if (!obsOn) return;
    const now = nowAbs();
    for (const key of ev.keysChanged) {
      const stamp = ev.target.get(key);
      if (stamp && obsReceived < obsLat.length) obsLat[obsReceived++] = now - stamp[2];
    }
  });
  await waitFor('observer synced', () => obs.synced);
  const children = groups.map((clients) => {
    const child = fork(fileURLToPath(import.meta.url), ['--worker'], { execArgv: [...(process.env.DEWLINE_BENCH_CLIENT_NODE_ARGS ?? '').split(' ').filter(Boolean), '--import', 'tsx'], stdio: ['ignore', 'inherit', 'inherit', 'ipc'] });
    const job: WorkerJob = { editKey, wsBase, clients, total: n, editsPerClient, partIds };
    child.send(job);
    return child;
  });
  const next = (child: ChildProcess) =>
    new Promise<Record<string, unknown>>((resolve, reject) => {
      const onExit = (code: number | null) => reject(new Error(`bench worker exited (${code}) before reporting`));
      child.once('exit', onExit);
      child.once('message', (m) => {
        child.off('exit', onExit);
        resolve(m as Record<string, unknown>);
      });
    });
  await Promise.all(children.map(next));
  await sleep(300);
  const cpu0 = cpuMs(pid);
  const wall0 = performance.now();
  const startAt = nowAbs() + 200;
  obsOn = true;
  const done = Promise.all(children.map(next));
  for (const c of children) c.send({ startAt });
  const reports = (await done) as unknown as { received: number; expected: number; latencies: number[]; cpuMs: number }[];
  for (const c of children) c.send({ type: 'bye' });
  obsOn = false;
  obs.destroy();
  obsDoc.destroy();
  const obsSorted = obsLat.slice(0, obsReceived).sort();
  const cpu1 = cpuMs(pid);
  const wall = performance.now() - wall0;
  const rss = rssMiB(pid);
  await Promise.all(children.map((c) => new Promise((r) => (c.exitCode !== null ? r(null) : c.once('exit', r)))));
  await sleep(300);
  let received = 0;
  let expected = 0;
  for (const r of reports) {
    received += r.received;
    expected += r.expected;
  }
  const sorted = new Float64Array(received);
  let o = 0;
  for (const r of reports) for (const x of r.latencies) sorted[o++] = x;
  sorted.sort();
  const edits = n * editsPerClient;
  return {
    clients: n,
    procs: k,
    edits,
    expected,
    received,
    p50: percentile(sorted, 50),
    p95: percentile(sorted, 95),
    p99: percentile(sorted, 99),
    max: sorted.length ? sorted[sorted.length - 1] : NaN,
    serverCpuPerUpdateMs: cpu0 !== null && cpu1 !== null ? (cpu1 - cpu0) / edits : null,
    serverCpuShare: cpu0 !== null && cpu1 !== null ? (cpu1 - cpu0) / wall : null,
    clientCpuShare: reports.reduce((a, r) => a + r.cpuMs, 0) / wall,
    serverRssMiB: rss,
    observer: { received: obsReceived, p50: percentile(obsSorted, 50), p95: percentile(obsSorted, 95), p99: percentile(obsSorted, 99), max: obsSorted.length ? obsSorted[obsSorted.length - 1] : NaN },
  };
}

async function main() {
  process.setMaxListeners(50);
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'dewline-bench-sync-'));
  const { child, port } = await startServer(path.join(dir, 'rooms.sqlite'));
  const hard = setTimeout(() => {
    console.error(`bench:sync: hard limit of ${HARD_LIMIT_MS / 1000} s reached, stopping`);
    child.kill('SIGKILL');
    process.exit(1);
  }, HARD_LIMIT_MS);
  hard.unref();
  const base = `http://127.0.0.1:${port}`;
  const wsBase = `ws://127.0.0.1:${port}/sync`;
  console.log(`bench:sync  server pid ${child.pid} on 127.0.0.1:${port}, ${os.cpus().length} cores, node ${process.version}`);
  console.log(`load average before: ${os.loadavg().map((x) => x.toFixed(2)).join(' ')} (other work on this machine competes for the same cores); DEWLINE_DB_SYNC=${process.env.DEWLINE_DB_SYNC ?? 'full (default)'}`);
  console.log(`each client: ${EDITS_PER_SECOND} edits/s for ${seconds} s; latency = edit sent -> applied at each other client (same clock)`);
  const results: RunResult[] = [];
  try {
    for (const n of counts) {
      const r = await run(n, procs, base, wsBase, child.pid!);
      results.push(r);
      const f = (x: number) => x.toFixed(1).padStart(7);
      console.log(
        `${String(n).padStart(3)} clients: ${r.edits} edits, ${r.received}/${r.expected} arrivals; latency ms p50 ${f(r.p50)} p95 ${f(r.p95)} p99 ${f(r.p99)} max ${f(r.max)}; ` +
          `server CPU ${r.serverCpuPerUpdateMs === null ? 'n/a' : r.serverCpuPerUpdateMs.toFixed(3) + ' ms/update'} (${r.serverCpuShare === null ? 'n/a' : (100 * r.serverCpuShare).toFixed(0) + ' % of a core'}), ` +
          `RSS ${r.serverRssMiB === null ? 'n/a' : r.serverRssMiB.toFixed(0) + ' MiB'}; simulated clients in ${r.procs} process(es) used ${(100 * r.clientCpuShare).toFixed(0)} % of a core`,
      );
      const o = r.observer;
      console.log(`             observer client alone in its process: ${o.received}/${r.edits} edits; latency ms p50 ${f(o.p50)} p95 ${f(o.p95)} p99 ${f(o.p99)} max ${f(o.max)}`);
    }
  } finally {
    child.kill('SIGTERM');
  }
  console.log(`load average after: ${os.loadavg().map((x) => x.toFixed(2)).join(' ')}`);
  const first = results[0];
  for (const r of results.slice(1)) console.log(`ratio p99 ${r.clients} clients / ${first.clients} clients: ${(r.p99 / first.p99).toFixed(2)}`);
  const last = results[results.length - 1];
  const pass = last.p99 < TARGET_P99_MS && last.received === last.expected;
  console.log(`target p99 < ${TARGET_P99_MS} ms at ${last.clients} clients, all clients: p99 ${last.p99.toFixed(1)} ms = ${(last.p99 / TARGET_P99_MS).toFixed(2)} x target, ${pass ? 'met' : 'NOT met'}`);
  const opass = last.observer.p99 < TARGET_P99_MS && last.observer.received === last.edits;
  console.log(`target p99 < ${TARGET_P99_MS} ms at ${last.clients} clients, observer: p99 ${last.observer.p99.toFixed(1)} ms = ${(last.observer.p99 / TARGET_P99_MS).toFixed(2)} x target, ${opass ? 'met' : 'NOT met'}`);
  clearTimeout(hard);
  fs.rmSync(dir, { recursive: true, force: true });
}

const isWorker = process.argv.includes('--worker');
(isWorker ? workerMain() : main()).then(
  () => process.exit(0),
  (err) => {
    console.error(err);
    process.exit(1);
  },
);
