/**
 * Live rooms: one Y.Doc and one Awareness per loaded room, the connections in it, and the rules
 * for what each connection may do. A room loads from storage on its first connection and unloads
 * (after a final compaction) when its last connection leaves.
 *
 * Order for an update from an edit connection: validate (protocol.ts) -> size check -> queue; the
 * queue of a room is flushed once per turn of the event loop (setImmediate): every queued update is
 * appended to SQLite in one transaction (one commit, so one sync to disk for the whole batch), then
 * each is applied with Y.applyUpdate, whose 'update' event broadcasts it to the other connections.
 * So nobody receives an update that is not on disk, and a burst from many people costs one commit;
 * a batch of several updates also goes out as one merged update per connection.
 */
import * as Y from 'yjs';
import * as awarenessProtocol from 'y-protocols/awareness';
import type { WebSocket } from 'ws';
import type { Role } from './keys';
import type { Limits } from './limits';
import type { Logger } from './log';
import type { Storage } from './storage';
import {
  ProtocolError,
  awarenessClientIds,
  decodeClientMessage,
  encodeAwarenessMessage,
  encodeRoleMessage,
  encodeSyncStep1,
  encodeSyncStep2,
  encodeUpdateMessage,
} from './protocol';

/** Close codes sent by the server (4400-4499: permanent for y-websocket 3, 4500-4599: retry later). */
export const closeCodes = Object.freeze({
  goingAway: 1001,
  tooBig: 1009, // sent by `ws` itself when a frame exceeds maxMessageBytes
  internalError: 1011,
  malformed: 4400,
  unknownKey: 4404,
  keyRevoked: 4410,
  docTooLarge: 4413,
  roomFull: 4503,
  serverFull: 4504,
});

export interface Connection {
  readonly ws: WebSocket;
  readonly role: Role;
  readonly keyHash: string;
  /** short log tag of the key (never the key) */
  readonly keyTag: string;
  readonly room: Room;
  /** awareness client ids this connection has spoken for */
  readonly awarenessIds: Set<number>;
  alive: boolean;
  closed: boolean;
}

export interface Room {
  readonly id: string;
  readonly doc: Y.Doc;
  readonly awareness: awarenessProtocol.Awareness;
  readonly conns: Set<Connection>;
  /** bytes of snapshot plus appended updates: an upper bound of the stored document size */
  storedBytes: number;
  /** seq of the last appended update */
  lastSeq: number;
  /** updates appended since the last compaction */
  pendingUpdates: number;
  lastCompactedAt: number;
  /** updates received and checked, waiting for the next commit */
  queue: { conn: Connection; update: Uint8Array }[];
  queuedBytes: number;
  flushScheduled: boolean;
  /** while a batch of several updates is applied: its broadcast goes out merged, after the batch */
  holdBroadcast: boolean;
}

export interface RoomStats {
  roomsLoaded: number;
  connections: number;
  updatesStored: number;
  viewUpdatesDropped: number;
  compactions: number;
  /** storage commits of queued updates (each holds one or more updates) */
  commits: number;
  /** batches broadcast as one merged update */
  mergedBroadcasts: number;
}

export function createRoomRegistry(deps: { storage: Storage; limits: Limits; log: Logger }) {
  const { storage, limits, log } = deps;
  const rooms = new Map<string, Room>();
  const stats: RoomStats = { roomsLoaded: 0, connections: 0, updatesStored: 0, viewUpdatesDropped: 0, compactions: 0, commits: 0, mergedBroadcasts: 0 };
  const roomTag = (id: string) => id.slice(0, 8);

  function send(conn: Connection, frame: Uint8Array): void {
    if (conn.closed || conn.ws.readyState !== conn.ws.OPEN) return;
    // a client that stops reading must not grow the server's memory without bound
    if (conn.ws.bufferedAmount > 16 * limits.maxMessageBytes) {
      log.warn('connection too slow, dropped', { room: roomTag(conn.room.id), key: conn.keyTag });
      conn.closed = true;
      conn.ws.terminate();
      return;
    }
    conn.ws.send(frame, (err) => {
      if (err) log.debug('send failed', { room: roomTag(conn.room.id), err: err.message });
    });
  }

  function compact(room: Room, why: string): void {
    if (room.pendingUpdates === 0) return;
    const snapshot = Y.encodeStateAsUpdate(room.doc);
    storage.writeSnapshot(room.id, snapshot, room.lastSeq);
    log.debug('compacted', { room: roomTag(room.id), why, updates: room.pendingUpdates, bytes: snapshot.length });
    room.storedBytes = snapshot.length;
    room.pendingUpdates = 0;
    room.lastCompactedAt = Date.now();
    stats.compactions++;
  }

  function loadRoom(id: string): Room {
    const stored = storage.loadRoom(id);
    const doc = new Y.Doc({ gc: true });
    let storedBytes = 0;
    let skipped = 0;
    if (stored.snapshot) {
      Y.applyUpdate(doc, stored.snapshot);
      storedBytes += stored.snapshot.length;
    }
    for (const u of stored.updates) {
      try {
        Y.applyUpdate(doc, u.data);
      } catch (err) {
        skipped++;
        log.error('stored update does not apply, skipped', { room: roomTag(id), seq: u.seq, err: String(err) });
      }
      storedBytes += u.data.length;
    }
    const awareness = new awarenessProtocol.Awareness(doc);
    awareness.setLocalState(null);
    const room: Room = {
      id,
      doc,
      awareness,
      conns: new Set(),
      storedBytes,
      lastSeq: stored.updates.length ? stored.updates[stored.updates.length - 1].seq : 0,
      pendingUpdates: stored.updates.length,
      lastCompactedAt: Date.now(),
      queue: [],
      queuedBytes: 0,
      flushScheduled: false,
      holdBroadcast: false,
    };
    doc.on('update', (update: Uint8Array, origin: unknown) => {
      if (room.holdBroadcast) return;
      const frame = encodeUpdateMessage(update);
      for (const c of room.conns) if (c !== origin) send(c, frame);
    });
    awareness.on('update', ({ added, updated, removed }: { added: number[]; updated: number[]; removed: number[] }, origin: unknown) => {
      const changed = added.concat(updated, removed);
      if (changed.length === 0) return;
      const from = room.conns.has(origin as Connection) ? (origin as Connection) : null;
      if (from) {
        for (const id of added) from.awarenessIds.add(id);
        for (const id of removed) from.awarenessIds.delete(id);
      }
      const frame = encodeAwarenessMessage(awareness, changed);
      for (const c of room.conns) if (c !== from) send(c, frame);
    });
    rooms.set(id, room);
    stats.roomsLoaded = rooms.size;
    log.info('room loaded', { room: roomTag(id), updates: stored.updates.length, bytes: storedBytes, skipped });
    return room;
  }

  function unloadRoom(room: Room): void {
    flush(room);
    try {
      compact(room, 'unload');
    } catch (err) {
      log.error('compaction on unload failed', { room: roomTag(room.id), err: String(err) });
    }
    room.awareness.destroy();
    room.doc.destroy();
    rooms.delete(room.id);
    stats.roomsLoaded = rooms.size;
    log.info('room unloaded', { room: roomTag(room.id) });
  }

  function closeConnection(conn: Connection, code: number, reason: string): void {
    if (conn.closed) return;
    conn.closed = true;
    log.info('connection closed by server', { room: roomTag(conn.room.id), key: conn.keyTag, role: conn.role, code, reason });
    conn.ws.close(code, reason);
  }

  function leave(conn: Connection): void {
    const room = conn.room;
    if (!room.conns.delete(conn)) return;
    stats.connections--;
    conn.closed = true;
    if (conn.awarenessIds.size > 0) {
      awarenessProtocol.removeAwarenessStates(room.awareness, Array.from(conn.awarenessIds), null);
    }
    if (room.conns.size === 0) unloadRoom(room);
  }

  function applyDocUpdate(conn: Connection, update: Uint8Array): void {
    const room = conn.room;
    if (room.storedBytes + room.queuedBytes + update.length > limits.maxDocBytes) {
      flush(room);
      compact(room, 'size check');
      if (room.storedBytes + update.length > limits.maxDocBytes) {
        closeConnection(conn, closeCodes.docTooLarge, 'document size limit reached');
        return;
      }
    }
    room.queue.push({ conn, update });
    room.queuedBytes += update.length;
    if (!room.flushScheduled) {
      room.flushScheduled = true;
      setImmediate(() => flush(room));
    }
  }

  /** Commits the room's queued updates in one transaction, then applies and broadcasts them in order. */
  function flush(room: Room): void {
    room.flushScheduled = false;
    if (room.queue.length === 0) return;
    const batch = room.queue;
    room.queue = [];
    room.queuedBytes = 0;
    let seqs: number[];
    try {
      seqs = storage.appendUpdates(room.id, batch.map((b) => b.update));
    } catch (err) {
      log.error('storing updates failed', { room: roomTag(room.id), updates: batch.length, err: String(err) });
      for (const c of new Set(batch.map((b) => b.conn))) closeConnection(c, closeCodes.internalError, 'storage failure');
      return;
    }
    // One update: broadcast by the doc's 'update' event to all but its sender. Several: one merged
    // update per connection for the whole batch (one frame instead of one per update; a sender
    // receiving its own updates back is a no-op in Yjs).
    const merge = batch.length > 1;
    room.holdBroadcast = merge;
    try {
      for (let i = 0; i < batch.length; i++) {
        const { conn, update } = batch[i];
        room.lastSeq = seqs[i];
        room.storedBytes += update.length;
        room.pendingUpdates++;
        stats.updatesStored++;
        Y.applyUpdate(room.doc, update, conn);
        // compaction covers seq <= lastSeq only: the rest of the batch stays stored until it is applied
        if (room.pendingUpdates >= limits.compactEveryUpdates) compact(room, 'count');
      }
    } finally {
      room.holdBroadcast = false;
    }
    stats.commits++;
    if (merge) {
      const frame = encodeUpdateMessage(Y.mergeUpdates(batch.map((b) => b.update)));
      const senders = new Set(batch.map((b) => b.conn));
      const only = senders.size === 1 ? batch[0].conn : null;
      for (const c of room.conns) if (c !== only) send(c, frame);
      stats.mergedBroadcasts++;
    }
  }

  function handleFrame(conn: Connection, frame: Uint8Array): void {
    if (conn.closed) return;
    const msg = decodeClientMessage(frame);
    switch (msg.kind) {
      case 'syncStep1':
        send(conn, encodeSyncStep2(conn.room.doc, msg.stateVector));
        return;
      case 'docUpdate':
        if (conn.role !== 'edit') {
          stats.viewUpdatesDropped++;
          log.debug('update from view key dropped', { room: roomTag(conn.room.id), key: conn.keyTag, bytes: msg.update.length });
          return;
        }
        applyDocUpdate(conn, msg.update);
        return;
      case 'awareness': {
        const ids = awarenessClientIds(msg.update);
        // a connection may not speak for a client id that another connection in the room owns
        for (const other of conn.room.conns) {
          if (other !== conn && ids.some((id) => other.awarenessIds.has(id))) {
            log.debug('awareness for a foreign client id ignored', { room: roomTag(conn.room.id), key: conn.keyTag });
            return;
          }
        }
        awarenessProtocol.applyAwarenessUpdate(conn.room.awareness, msg.update, conn);
        // ids that re-announce an unchanged state emit no 'update'; remember them anyway
        for (const id of ids) {
          if (conn.room.awareness.getStates().has(id)) conn.awarenessIds.add(id);
        }
        return;
      }
      case 'queryAwareness': {
        const ids = Array.from(conn.room.awareness.getStates().keys());
        if (ids.length) send(conn, encodeAwarenessMessage(conn.room.awareness, ids));
        return;
      }
    }
  }

  return {
    /**
     * Puts an open websocket into the room `roomId` with `role`. Sends the role message, then (edit)
     * sync step 1, then the awareness states of the others. Returns null if a limit refused it.
     */
    join(ws: WebSocket, a: { roomId: string; role: Role; keyHash: string; keyTag: string }): Connection | null {
      if (stats.connections >= limits.maxConnections) {
        ws.close(closeCodes.serverFull, 'server connection limit reached');
        log.warn('connection refused: server full', { key: a.keyTag });
        return null;
      }
      const existing = rooms.get(a.roomId);
      if (existing && existing.conns.size >= limits.maxConnectionsPerRoom) {
        ws.close(closeCodes.roomFull, 'room connection limit reached');
        log.warn('connection refused: room full', { room: roomTag(a.roomId), key: a.keyTag });
        return null;
      }
      const room = existing ?? loadRoom(a.roomId);
      const conn: Connection = { ws, role: a.role, keyHash: a.keyHash, keyTag: a.keyTag, room, awarenessIds: new Set(), alive: true, closed: false };
      room.conns.add(conn);
      stats.connections++;
      ws.on('message', (data, isBinary) => {
        if (conn.closed) return;
        if (!isBinary) {
          closeConnection(conn, closeCodes.malformed, 'text frames are not part of the protocol');
          return;
        }
        const frame = Array.isArray(data) ? Buffer.concat(data) : data instanceof ArrayBuffer ? new Uint8Array(data) : data;
        try {
          handleFrame(conn, new Uint8Array(frame.buffer, frame.byteOffset, frame.byteLength));
        } catch (err) {
          if (err instanceof ProtocolError) {
            closeConnection(conn, closeCodes.malformed, ('malformed message: ' + err.message).slice(0, 120));
          } else {
            log.error('message handling failed', { room: roomTag(room.id), key: conn.keyTag, err: String(err) });
            closeConnection(conn, closeCodes.internalError, 'internal error');
          }
        }
      });
      ws.on('pong', () => {
        conn.alive = true;
      });
      ws.on('close', () => leave(conn));
      ws.on('error', (err) => {
        // e.g. frame over maxPayload: `ws` closes with 1009 itself
        log.info('connection error', { room: roomTag(room.id), key: conn.keyTag, err: err.message });
      });
      log.info('connection joined', { room: roomTag(room.id), key: conn.keyTag, role: conn.role, inRoom: room.conns.size });
      send(conn, encodeRoleMessage(conn.role));
      if (conn.role === 'edit') send(conn, encodeSyncStep1(room.doc));
      const ids = Array.from(room.awareness.getStates().keys());
      if (ids.length) send(conn, encodeAwarenessMessage(room.awareness, ids));
      return conn;
    },
    /** Closes every live connection that came in with the given key hash. */
    closeConnectionsWithKey(keyHash: string, code: number, reason: string): number {
      let n = 0;
      for (const room of rooms.values()) {
        for (const c of room.conns) {
          if (c.keyHash === keyHash) {
            closeConnection(c, code, reason);
            n++;
          }
        }
      }
      return n;
    },
    /** Closes every live connection of `role` in the room (after that role's key was rotated). */
    closeRoleInRoom(roomId: string, role: Role, code: number, reason: string): number {
      const room = rooms.get(roomId);
      if (!room) return 0;
      let n = 0;
      for (const c of room.conns) {
        if (c.role === role) {
          closeConnection(c, code, reason);
          n++;
        }
      }
      return n;
    },
    /** Compacts rooms with pending updates older than the interval; pings and drops dead sockets. */
    tick(now = Date.now()): void {
      for (const room of rooms.values()) {
        if (room.pendingUpdates > 0 && now - room.lastCompactedAt >= limits.compactIntervalMs) {
          try {
            compact(room, 'interval');
          } catch (err) {
            log.error('compaction failed', { room: roomTag(room.id), err: String(err) });
          }
        }
      }
    },
    ping(): void {
      for (const room of rooms.values()) {
        for (const c of room.conns) {
          if (!c.alive) {
            c.closed = true;
            c.ws.terminate();
            continue;
          }
          c.alive = false;
          c.ws.ping();
        }
      }
    },
    /** Compacts every loaded room now (e.g. on shutdown). */
    compactAll(why = 'request'): void {
      for (const room of rooms.values()) {
        flush(room);
        compact(room, why);
      }
    },
    /** Closes every connection (1001) and unloads every room. */
    closeAll(): void {
      for (const room of Array.from(rooms.values())) {
        for (const c of Array.from(room.conns)) {
          closeConnection(c, closeCodes.goingAway, 'server shutting down');
          leave(c);
        }
        if (rooms.has(room.id)) unloadRoom(room);
      }
    },
    /** The room's whole document as one update: from memory when loaded, else rebuilt from storage. */
    currentState(roomId: string): Uint8Array {
      const loaded = rooms.get(roomId);
      if (loaded) return Y.encodeStateAsUpdate(loaded.doc);
      const stored = storage.loadRoom(roomId);
      const doc = new Y.Doc({ gc: true });
      if (stored.snapshot) Y.applyUpdate(doc, stored.snapshot);
      for (const u of stored.updates) {
        try {
          Y.applyUpdate(doc, u.data);
        } catch {
          // same rule as loading: an update that does not apply is skipped (and logged there)
        }
      }
      const state = Y.encodeStateAsUpdate(doc);
      doc.destroy();
      return state;
    },
    /** The loaded room with this internal id, if any (tests and stats). */
    loadedRoom(id: string): Room | undefined {
      return rooms.get(id);
    },
    stats(): RoomStats {
      return { ...stats };
    },
  };
}

export type RoomRegistry = ReturnType<typeof createRoomRegistry>;
