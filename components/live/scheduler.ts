/**
 * Which solve runs next. One solve runs in the worker at a time. A release (default mesh) supersedes and
 * cancels whatever runs; while dragging, a running preview solve is left to finish and only the newest
 * preview request waits (each older waiting request is dropped), so results keep arriving at solve rate.
 *
 * The policy lives twice, in step: `Scheduler` on the page (what is running, for the status line and to
 * match results to drawings) and `SolveQueue` in the worker. Every request is posted to the worker at
 * once, and the worker starts the waiting preview itself when the running one ends, so the next solve
 * never waits for the page's main thread, which is busiest exactly while the user drags.
 */
export type Mesh = 'preview' | 'default' | 'fine';

export interface Request<S> { id: number; snapshot: S; mesh: Mesh; version: number }

export type Effect<S> = { type: 'send'; req: Request<S> } | { type: 'cancel'; id: number };

export class Scheduler<S> {
  private nextId = 1;
  running: Request<S> | null = null;
  waiting: Request<S> | null = null;

  /** A new drawn state. Returns what to tell the worker. */
  request(snapshot: S, mesh: Mesh, version: number): Effect<S>[] {
    const req: Request<S> = { id: this.nextId++, snapshot, mesh, version };
    if (!this.running) {
      this.running = req;
      this.waiting = null;
      return [{ type: 'send', req }];
    }
    if (mesh === 'preview' && this.running.mesh === 'preview') {
      // The worker keeps it as its waiting preview (dropping the one it held) and starts it itself.
      this.waiting = req;
      return [{ type: 'send', req }];
    }
    const out: Effect<S>[] = [{ type: 'cancel', id: this.running.id }, { type: 'send', req }];
    this.running = req;
    this.waiting = null;
    return out;
  }

  /** The worker finished (result, error or cancelled) request `id`; it starts the waiting one on its own. */
  done(id: number): Effect<S>[] {
    if (!this.running || this.running.id !== id) return [];
    this.running = this.waiting;
    this.waiting = null;
    return [];
  }

  /** The user stops the running solve (the worker drops the waiting one with it). */
  stop(): Effect<S>[] {
    if (!this.running) return [];
    const id = this.running.id;
    this.running = null;
    this.waiting = null;
    return [{ type: 'cancel', id }];
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
