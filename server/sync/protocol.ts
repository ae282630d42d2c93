/**
 * Wire format: the standard y-websocket framing (lib0 varUint message type, then the payload), plus
 * one message of our own, `messageRole`, that the server sends first on every connection.
 *
 *   0 messageSync            y-protocols/sync: step 1 (state vector), step 2 (update), update
 *   1 messageAwareness       y-protocols/awareness update
 *   2 messageAuth            (server to client only, unused here)
 *   3 messageQueryAwareness  client asks for all awareness states
 *   100 messageRole          server to client: varString 'edit' | 'view'
 *
 * Decoding is strict: a frame must hold exactly one well-formed message, or `decodeClientMessage`
 * throws a ProtocolError. Document updates are fully parsed (Y.decodeUpdate) before anyone stores them.
 */
import * as Y from 'yjs';
import * as encoding from 'lib0/encoding';
import * as decoding from 'lib0/decoding';
import * as syncProtocol from 'y-protocols/sync';
import * as awarenessProtocol from 'y-protocols/awareness';
import type { Role } from './keys';

export const messageSync = 0;
export const messageAwareness = 1;
export const messageAuth = 2;
export const messageQueryAwareness = 3;
/** Dewline's own message type: the connection's role, sent by the server right after connecting. */
export const messageRole = 100;

export const syncStep1 = syncProtocol.messageYjsSyncStep1; // 0
export const syncStep2 = syncProtocol.messageYjsSyncStep2; // 1
export const syncUpdate = syncProtocol.messageYjsUpdate; // 2

export class ProtocolError extends Error {
  override name = 'ProtocolError';
}

export type ClientMessage =
  | { kind: 'syncStep1'; stateVector: Uint8Array }
  | { kind: 'docUpdate'; step: 'step2' | 'update'; update: Uint8Array }
  | { kind: 'awareness'; update: Uint8Array }
  | { kind: 'queryAwareness' };

function fail(why: string): never {
  throw new ProtocolError(why);
}

/** Checks that an awareness update parses completely (clients, clocks, JSON states). */
export function assertAwarenessUpdate(update: Uint8Array): void {
  const d = decoding.createDecoder(update);
  const n = decoding.readVarUint(d);
  for (let i = 0; i < n; i++) {
    decoding.readVarUint(d);
    decoding.readVarUint(d);
    JSON.parse(decoding.readVarString(d));
  }
  if (decoding.hasContent(d)) fail('trailing bytes in awareness update');
}

/** Decodes one frame sent by a client. Throws ProtocolError with a short reason if it is malformed. */
export function decodeClientMessage(frame: Uint8Array): ClientMessage {
  let msg: ClientMessage;
  let d: decoding.Decoder;
  try {
    d = decoding.createDecoder(frame);
    const type = decoding.readVarUint(d);
    if (type === messageSync) {
      const step = decoding.readVarUint(d);
      const payload = decoding.readVarUint8Array(d);
      if (step === syncStep1) {
        Y.decodeStateVector(payload);
        msg = { kind: 'syncStep1', stateVector: payload };
      } else if (step === syncStep2 || step === syncUpdate) {
        Y.decodeUpdate(payload);
        msg = { kind: 'docUpdate', step: step === syncStep2 ? 'step2' : 'update', update: payload };
      } else {
        return fail(`unknown sync step ${step}`);
      }
    } else if (type === messageAwareness) {
      const payload = decoding.readVarUint8Array(d);
      assertAwarenessUpdate(payload);
      msg = { kind: 'awareness', update: payload };
    } else if (type === messageQueryAwareness) {
      msg = { kind: 'queryAwareness' };
    } else {
      return fail(`unknown message type ${type}`);
    }
  } catch (err) {
    if (err instanceof ProtocolError) throw err;
    return fail(`undecodable message (${err instanceof Error ? err.message : String(err)})`);
  }
  if (decoding.hasContent(d)) fail('trailing bytes after message');
  return msg;
}

/** messageRole frame. */
export function encodeRoleMessage(role: Role): Uint8Array {
  const e = encoding.createEncoder();
  encoding.writeVarUint(e, messageRole);
  encoding.writeVarString(e, role);
  return encoding.toUint8Array(e);
}

/** Reads the role from a messageRole payload (the decoder is positioned after the type). */
export function readRole(decoder: decoding.Decoder): Role {
  const role = decoding.readVarString(decoder);
  if (role !== 'edit' && role !== 'view') throw new ProtocolError(`unknown role ${JSON.stringify(role)}`);
  return role;
}

/** Sync step 1 frame carrying the doc's state vector. */
export function encodeSyncStep1(doc: Y.Doc): Uint8Array {
  const e = encoding.createEncoder();
  encoding.writeVarUint(e, messageSync);
  syncProtocol.writeSyncStep1(e, doc);
  return encoding.toUint8Array(e);
}

/** Sync step 2 frame: everything in `doc` that the holder of `stateVector` lacks. */
export function encodeSyncStep2(doc: Y.Doc, stateVector: Uint8Array): Uint8Array {
  const e = encoding.createEncoder();
  encoding.writeVarUint(e, messageSync);
  syncProtocol.writeSyncStep2(e, doc, stateVector);
  return encoding.toUint8Array(e);
}

/** Sync update frame for one document update. */
export function encodeUpdateMessage(update: Uint8Array): Uint8Array {
  const e = encoding.createEncoder();
  encoding.writeVarUint(e, messageSync);
  syncProtocol.writeUpdate(e, update);
  return encoding.toUint8Array(e);
}

/** Awareness frame for the given clients' states. */
export function encodeAwarenessMessage(awareness: awarenessProtocol.Awareness, clients: number[]): Uint8Array {
  const e = encoding.createEncoder();
  encoding.writeVarUint(e, messageAwareness);
  encoding.writeVarUint8Array(e, awarenessProtocol.encodeAwarenessUpdate(awareness, clients));
  return encoding.toUint8Array(e);
}

/** The client ids an awareness update speaks for (update must already be validated). */
export function awarenessClientIds(update: Uint8Array): number[] {
  const d = decoding.createDecoder(update);
  const n = decoding.readVarUint(d);
  const ids: number[] = [];
  for (let i = 0; i < n; i++) {
    ids.push(decoding.readVarUint(d));
    decoding.readVarUint(d);
    decoding.readVarString(d);
  }
  return ids;
}
