/**
 * Which solve runs next. One solve runs in the worker at a time. A release (default mesh) supersedes and
 * cancels whatever runs; while dragging, a running preview solve is left to finish and only the newest
 * preview request waits (each older waiting request is dropped), so results keep arriving at solve rate.
 *
 * The policy lives in the worker (`SolveQueue`): every request is posted to the worker at once, and the
 * worker starts the waiting preview itself when the running one ends, so the next solve never waits for
 * the page's main thread, which is busiest exactly while the user drags.
 *
 * The page (`Scheduler`) does not mirror the worker's queue: messages take time both ways (the worker
 * reads the page's requests only between the slices of a solve, and a solve's first and last slices run
 * for tens of milliseconds), so a mirror guesses wrong about which request the worker started. It keeps
 * every request it posted until the worker answers it (the worker answers each exactly once, with a
 * result, an error or 'cancelled') and looks results up by id.
 */
export type Mesh = 'preview' | 'default' | 'fine';

export interface Request<S> { id: number; snapshot: S; mesh: Mesh; version: number }

export type Effect<S> = { type: 'send'; req: Request<S> } | { type: 'cancel'; id: number };

export class Scheduler<S> {
  private nextId = 1;
  /** Requests posted and not yet answered, oldest first (a Map keeps insertion order). */
  private readonly open = new Map<number, Request<S>>();

  /** A new drawn state: post it. The worker decides whether it waits, supersedes or aborts (SolveQueue.solve). */
  request(snapshot: S, mesh: Mesh, version: number): Effect<S>[] {
    const req: Request<S> = { id: this.nextId++, snapshot, mesh, version };
    this.open.set(req.id, req);
    return [{ type: 'send', req }];
  }

  /** The request `id` was posted and is not yet answered (for progress messages and results). */
  get(id: number): Request<S> | null {
    return this.open.get(id) ?? null;
  }

  /** The worker answered request `id` (result, error or cancelled): the request it belonged to, or null. */
  done(id: number): Request<S> | null {
    const req = this.open.get(id) ?? null;
    this.open.delete(id);
    return req;
  }

  /** Is any request still unanswered (the worker is solving or about to)? */
  get busy(): boolean {
    return this.open.size > 0;
  }

  /** The user stops solving: cancel every unanswered request (the worker aborts the running one and drops the waiting one). */
  stop(): Effect<S>[] {
    return [...this.open.keys()].map((id) => ({ type: 'cancel' as const, id }));
  }

  /** Should a result for `id` be shown? Only one newer than what is shown. */
  static fresher(id: number, shownId: number): boolean {
    return id > shownId;
  }
}

export interface Job { id: number; mesh: Mesh }

/** What the worker does: start a job, abort the running one (it reports itself cancelled), or drop a waiting one unstarted. */
export type QueueAction<J extends Job> = { type: 'start'; job: J } | { type: 'abort'; id: number } | { type: 'drop'; id: number };

/** The worker's side of the policy above. */
export class SolveQueue<J extends Job> {
  running: J | null = null;
  pending: J | null = null;

  solve(job: J): QueueAction<J>[] {
    if (this.running && this.running.mesh === 'preview' && job.mesh === 'preview') {
      const out: QueueAction<J>[] = this.pending ? [{ type: 'drop', id: this.pending.id }] : [];
      this.pending = job;
      return out;
    }
    const out: QueueAction<J>[] = [];
    if (this.running) out.push({ type: 'abort', id: this.running.id });
    if (this.pending) out.push({ type: 'drop', id: this.pending.id });
    this.running = job;
    this.pending = null;
    out.push({ type: 'start', job });
    return out;
  }

  cancel(id: number): QueueAction<J>[] {
    if (this.pending && this.pending.id === id) {
      this.pending = null;
      return [{ type: 'drop', id }];
    }
    if (!this.running || this.running.id !== id) return [];
    const out: QueueAction<J>[] = [{ type: 'abort', id }];
    if (this.pending) out.push({ type: 'drop', id: this.pending.id });
    this.running = null;
    this.pending = null;
    return out;
  }

  /** The running job `id` ended (result, error or aborted). */
  finished(id: number): QueueAction<J>[] {
    if (!this.running || this.running.id !== id) return [];
    this.running = this.pending;
    this.pending = null;
    return this.running ? [{ type: 'start', job: this.running }] : [];
  }
}
