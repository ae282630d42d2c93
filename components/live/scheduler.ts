/**
 * Which solve runs next. One solve runs in the worker at a time. A release (default mesh) supersedes and
 * cancels whatever runs; while dragging, a running preview solve is left to finish and only the newest
 * preview request waits (each older waiting request is dropped), so results keep arriving at solve rate.
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
      this.waiting = req;
      return [];
    }
    const out: Effect<S>[] = [{ type: 'cancel', id: this.running.id }, { type: 'send', req }];
    this.running = req;
    this.waiting = null;
    return out;
  }

  /** The worker finished (result, error or cancelled) request `id`. Returns what to send next. */
  done(id: number): Effect<S>[] {
    if (!this.running || this.running.id !== id) return [];
    this.running = this.waiting;
    this.waiting = null;
    return this.running ? [{ type: 'send', req: this.running }] : [];
  }

  /** The user stops the running solve. */
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
