/**
 * The connection indicator's state, derived from what the provider reported. Pure: the page feeds
 * it events, the indicator shows `describeStatus`.
 */
import type { Role } from './api';

export interface ConnectionFacts {
  /** the websocket provider's last status */
  socket: 'connecting' | 'connected' | 'disconnected';
  /** the document has synced with the server since the socket connected */
  synced: boolean;
  /** the browser says it has a network */
  online: boolean;
  /** close code of a close the provider will not retry (4400-4499), else null */
  terminal: number | null;
  /** role the server announced for this key */
  role: Role | null;
}

export type StatusKind = 'connecting' | 'live' | 'read-only' | 'reconnecting' | 'offline' | 'revoked' | 'unknown-key' | 'refused';

export interface Status {
  kind: StatusKind;
  text: string;
  /** the person can press "Reconnect" */
  canRetry: boolean;
}

export const initialFacts: ConnectionFacts = { socket: 'connecting', synced: false, online: true, terminal: null, role: null };

/** Words for the server's permanent close codes (docs/rooms.md). */
export function closeCodeText(code: number): string {
  switch (code) {
    case 4400:
      return 'the server refused a malformed message';
    case 4404:
      return 'this link is not known: it may be mistyped, or it was revoked';
    case 4410:
      return 'this link was revoked: someone with the edit link made a new one';
    case 4413:
      return 'the section reached the size limit';
    default:
      return `the server closed the connection (code ${code})`;
  }
}

export function describeStatus(f: ConnectionFacts, hasEverSynced: boolean): Status {
  if (f.terminal === 4410) return { kind: 'revoked', text: 'Link revoked: ' + closeCodeText(4410) + '.', canRetry: false };
  if (f.terminal === 4404) return { kind: 'unknown-key', text: 'Unknown link: ' + closeCodeText(4404) + '.', canRetry: false };
  if (f.terminal !== null) return { kind: 'refused', text: 'Disconnected: ' + closeCodeText(f.terminal) + '.', canRetry: true };
  if (!f.online) return { kind: 'offline', text: f.role === 'edit' ? 'Offline: your edits are kept in this browser and sync when the connection returns.' : 'Offline.', canRetry: true };
  if (f.socket === 'connected' && f.synced) return f.role === 'view' ? { kind: 'read-only', text: 'Live, view only', canRetry: false } : { kind: 'live', text: 'Live', canRetry: false };
  if (f.socket === 'disconnected' || (hasEverSynced && !f.synced)) return { kind: 'reconnecting', text: 'Reconnecting…', canRetry: true };
  return { kind: 'connecting', text: 'Connecting…', canRetry: false };
}
