/**
 * Joins a room: a y-websocket provider on ws(s)://host/sync/<key> with the server's role message
 * (type 100, docs/rooms.md) read into `onRole`. Works in the browser and in Node (pass `ws` as
 * WebSocketPolyfill).
 */
import * as decoding from 'lib0/decoding';
import { WebsocketProvider } from 'y-websocket';
import type * as Y from 'yjs';
import type { Awareness } from 'y-protocols/awareness';
import type { Role } from './api';

export const MESSAGE_ROLE = 100;

export interface JoinOptions {
  /** ws://host/sync or wss://host/sync */
  syncUrl: string;
  WebSocketPolyfill?: typeof WebSocket;
  awareness?: Awareness;
  onRole?: (role: Role) => void;
  /** most time between reconnect attempts, ms */
  maxBackoffTime?: number;
  connect?: boolean;
}

/** The sync URL of the page's own server: ws(s)://<host>/sync. */
export function syncUrlFor(location: { protocol: string; host: string }): string {
  return `${location.protocol === 'https:' ? 'wss' : 'ws'}://${location.host}/sync`;
}

export function joinRoom(doc: Y.Doc, key: string, opts: JoinOptions): WebsocketProvider {
  const provider = new WebsocketProvider(opts.syncUrl, key, doc, {
    WebSocketPolyfill: opts.WebSocketPolyfill,
    awareness: opts.awareness,
    // the server is the only path between people: no cross-tab shortcut that could bypass its rules
    disableBc: true,
    maxBackoffTime: opts.maxBackoffTime ?? 2500,
    connect: opts.connect ?? true,
  });
  provider.messageHandlers[MESSAGE_ROLE] = (_enc, dec) => {
    const role = decoding.readVarString(dec);
    if (role === 'edit' || role === 'view') opts.onRole?.(role);
  };
  return provider;
}
