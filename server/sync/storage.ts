/**
 * Room storage in one SQLite file (better-sqlite3, journal_mode WAL).
 *
 *   rooms(id, created_at, view_key_sealed)          one row per room; id is internal, never shown
 *   room_keys(key_hash, room_id, role, created_at)  SHA-256 of each live key; one edit and one view per room
 *   snapshots(room_id, data, updated_at)            Y.encodeStateAsUpdate of the compacted document
 *   updates(seq, room_id, data, created_at)         updates appended since the snapshot
 *   versions(id, room_id, name, data, created_at)   named versions: Y.encodeStateAsUpdate at the moment of saving
 *
 * The document of a room is its snapshot followed by its updates in seq order. Compaction replaces
 * the snapshot and deletes the updates it covers in one transaction.
 */
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import type { Role } from './keys';

export type SyncMode = 'full' | 'normal';

export interface VersionInfo {
  id: number;
  name: string;
  createdAt: number;
  bytes: number;
}

export interface StoredRoom {
  snapshot: Uint8Array | null;
  updates: { seq: number; data: Uint8Array }[];
}

const schema = `
CREATE TABLE IF NOT EXISTS rooms (
  id TEXT PRIMARY KEY,
  created_at INTEGER NOT NULL,
  view_key_sealed BLOB NOT NULL
);
CREATE TABLE IF NOT EXISTS room_keys (
  key_hash TEXT PRIMARY KEY,
  room_id TEXT NOT NULL REFERENCES rooms(id),
  role TEXT NOT NULL CHECK (role IN ('edit', 'view')),
  created_at INTEGER NOT NULL,
  UNIQUE (room_id, role)
);
CREATE TABLE IF NOT EXISTS snapshots (
  room_id TEXT PRIMARY KEY REFERENCES rooms(id),
  data BLOB NOT NULL,
  updated_at INTEGER NOT NULL
);
CREATE TABLE IF NOT EXISTS updates (
  seq INTEGER PRIMARY KEY AUTOINCREMENT,
  room_id TEXT NOT NULL REFERENCES rooms(id),
  data BLOB NOT NULL,
  created_at INTEGER NOT NULL
);
CREATE INDEX IF NOT EXISTS updates_by_room ON updates (room_id, seq);
CREATE TABLE IF NOT EXISTS versions (
  id INTEGER PRIMARY KEY AUTOINCREMENT,
  room_id TEXT NOT NULL REFERENCES rooms(id),
  name TEXT NOT NULL,
  data BLOB NOT NULL,
  created_at INTEGER NOT NULL
);
CREATE INDEX IF NOT EXISTS versions_by_room ON versions (room_id, id);
`;

export function openStorage(file: string, opts: { sync?: SyncMode } = {}) {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const db = new Database(file);
  db.pragma('journal_mode = WAL');
  db.pragma(`synchronous = ${opts.sync === 'normal' ? 'NORMAL' : 'FULL'}`);
  db.pragma('foreign_keys = ON');
  db.pragma('busy_timeout = 5000');
  db.exec(schema);

  const q = {
    insertRoom: db.prepare('INSERT INTO rooms (id, created_at, view_key_sealed) VALUES (?, ?, ?)'),
    insertKey: db.prepare('INSERT INTO room_keys (key_hash, room_id, role, created_at) VALUES (?, ?, ?, ?)'),
    deleteKey: db.prepare('DELETE FROM room_keys WHERE room_id = ? AND role = ?'),
    findKey: db.prepare('SELECT room_id AS roomId, role FROM room_keys WHERE key_hash = ?'),
    sealed: db.prepare('SELECT view_key_sealed AS sealed FROM rooms WHERE id = ?'),
    setSealed: db.prepare('UPDATE rooms SET view_key_sealed = ? WHERE id = ?'),
    snapshot: db.prepare('SELECT data FROM snapshots WHERE room_id = ?'),
    updates: db.prepare('SELECT seq, data FROM updates WHERE room_id = ? ORDER BY seq'),
    append: db.prepare('INSERT INTO updates (room_id, data, created_at) VALUES (?, ?, ?)'),
    upsertSnapshot: db.prepare(
      'INSERT INTO snapshots (room_id, data, updated_at) VALUES (?, ?, ?) ON CONFLICT (room_id) DO UPDATE SET data = excluded.data, updated_at = excluded.updated_at',
    ),
    deleteUpdatesUpTo: db.prepare('DELETE FROM updates WHERE room_id = ? AND seq <= ?'),
    countRooms: db.prepare('SELECT count(*) AS n FROM rooms'),
    insertVersion: db.prepare('INSERT INTO versions (room_id, name, data, created_at) VALUES (?, ?, ?, ?)'),
    listVersions: db.prepare('SELECT id, name, created_at AS createdAt, length(data) AS bytes FROM versions WHERE room_id = ? ORDER BY id DESC'),
    countVersions: db.prepare('SELECT count(*) AS n FROM versions WHERE room_id = ?'),
    versionData: db.prepare('SELECT data FROM versions WHERE room_id = ? AND id = ?'),
  };

  const createRoom = db.transaction((r: { roomId: string; editHash: string; viewHash: string; viewKeySealed: Uint8Array }) => {
    const now = Date.now();
    q.insertRoom.run(r.roomId, now, r.viewKeySealed);
    q.insertKey.run(r.editHash, r.roomId, 'edit', now);
    q.insertKey.run(r.viewHash, r.roomId, 'view', now);
  });

  const replaceKey = db.transaction((roomId: string, role: Role, newHash: string, viewKeySealed: Uint8Array) => {
    q.deleteKey.run(roomId, role);
    q.insertKey.run(newHash, roomId, role, Date.now());
    q.setSealed.run(viewKeySealed, roomId);
  });

  const appendMany = db.transaction((roomId: string, datas: readonly Uint8Array[]) => {
    const now = Date.now();
    return datas.map((d) => Number(q.append.run(roomId, d, now).lastInsertRowid));
  });

  const writeSnapshot = db.transaction((roomId: string, data: Uint8Array, upToSeq: number) => {
    q.upsertSnapshot.run(roomId, data, Date.now());
    q.deleteUpdatesUpTo.run(roomId, upToSeq);
  });

  return {
    file,
    /** Creates a room with its two key hashes (throws if a hash already exists). */
    createRoom(r: { roomId: string; editHash: string; viewHash: string; viewKeySealed: Uint8Array }): void {
      createRoom(r);
    },
    /** The room and role a key hash opens, or null. */
    findKey(keyHash: string): { roomId: string; role: Role } | null {
      return (q.findKey.get(keyHash) as { roomId: string; role: Role } | undefined) ?? null;
    },
    viewKeySealed(roomId: string): Uint8Array | null {
      const row = q.sealed.get(roomId) as { sealed: Buffer } | undefined;
      return row ? new Uint8Array(row.sealed) : null;
    },
    /** Swaps the room's key of `role` for a new hash, and stores the re-sealed view key, atomically. */
    replaceKey(roomId: string, role: Role, newHash: string, viewKeySealed: Uint8Array): void {
      replaceKey(roomId, role, newHash, viewKeySealed);
    },
    /** Appends one update (committed when this returns); returns its seq. */
    appendUpdate(roomId: string, data: Uint8Array): number {
      return Number(q.append.run(roomId, data, Date.now()).lastInsertRowid);
    },
    /** Appends several updates in one transaction (one commit, one sync to disk); returns their seqs in order. */
    appendUpdates(roomId: string, datas: readonly Uint8Array[]): number[] {
      return appendMany(roomId, datas);
    },
    loadRoom(roomId: string): StoredRoom {
      const snap = q.snapshot.get(roomId) as { data: Buffer } | undefined;
      const rows = q.updates.all(roomId) as { seq: number; data: Buffer }[];
      return {
        snapshot: snap ? new Uint8Array(snap.data) : null,
        updates: rows.map((r) => ({ seq: Number(r.seq), data: new Uint8Array(r.data) })),
      };
    },
    /** Replaces the snapshot and deletes updates with seq <= upToSeq, in one transaction. */
    writeSnapshot(roomId: string, data: Uint8Array, upToSeq: number): void {
      writeSnapshot(roomId, data, upToSeq);
    },
    /** Stores a named version of the room's document; returns its listing row. */
    addVersion(roomId: string, name: string, data: Uint8Array): VersionInfo {
      const createdAt = Date.now();
      const id = Number(q.insertVersion.run(roomId, name, data, createdAt).lastInsertRowid);
      return { id, name, createdAt, bytes: data.length };
    },
    /** The room's named versions, newest first (without their data). */
    listVersions(roomId: string): VersionInfo[] {
      return (q.listVersions.all(roomId) as VersionInfo[]).map((r) => ({ id: Number(r.id), name: r.name, createdAt: Number(r.createdAt), bytes: Number(r.bytes) }));
    },
    versionCount(roomId: string): number {
      return (q.countVersions.get(roomId) as { n: number }).n;
    },
    /** The stored document of one version of this room, or null (unknown id, or another room's). */
    versionData(roomId: string, id: number): Uint8Array | null {
      const row = q.versionData.get(roomId, id) as { data: Buffer } | undefined;
      return row ? new Uint8Array(row.data) : null;
    },
    roomCount(): number {
      return (q.countRooms.get() as { n: number }).n;
    },
    close(): void {
      db.close();
    },
  };
}

export type Storage = ReturnType<typeof openStorage>;
