/** The rooms' pure functions: presence parsing, colours, names, connection status, first content. */
import { describe, expect, it } from 'vitest';
import * as Y from 'yjs';
import { docFromSnapshot, readSection } from '@/lib/section/doc';
import { templateByName } from '@/lib/section/templates/index';
import { initialiseRoom, isEmptyRoom } from './initial';
import { cleanName, colourForClient, defaultName, PERSON_COLOURS, peersOf, pointerMoved, presenceOf } from './presence';
import { describeStatus, initialFacts } from './status';
import { isRoomKey } from './api';
import { countDifferences, restoreVersion, sectionOfVersion } from './versions';

describe('presence', () => {
  it('gives every client id a palette colour, the same one each time, and spreads consecutive ids', () => {
    const seen = new Set<string>();
    for (let id = 1000; id < 1012; id++) {
      expect(PERSON_COLOURS).toContain(colourForClient(id));
      expect(colourForClient(id)).toBe(colourForClient(id));
      seen.add(colourForClient(id));
    }
    expect(seen.size).toBeGreaterThanOrEqual(6);
  });

  it('cleans typed names: control characters out, spaces collapsed, 40 characters at most, empty refused', () => {
    expect(cleanName('  Site\u0000 \n consultant  ')).toBe('Site consultant');
    expect(cleanName('x'.repeat(60))).toHaveLength(40);
    expect(cleanName('   ')).toBeNull();
    expect(cleanName(42)).toBeNull();
    expect(defaultName(123456)).toBe('Guest 456');
  });

  it("reads other people's states without trusting them", () => {
    expect(presenceOf(null, 1)).toBeNull();
    expect(presenceOf({ pointer: [1, 2] }, 1)).toBeNull();
    const p = presenceOf({ user: { name: 'A\u200b\u200bnn', colour: 'red' }, pointer: [1, Number.NaN], selection: { parts: ['a', 5, 'b'] } }, 7)!;
    expect(p.user.name).toBe('Ann');
    expect(p.user.colour).toBe(colourForClient(7));
    expect(p.pointer).toBeNull();
    expect(p.selection).toEqual({ parts: ['a', 'b'], zones: [] });
    const states = new Map<number, unknown>([
      [1, { user: { name: 'Zed', colour: '#112233' } }],
      [2, { user: { name: 'Amy', colour: '#445566' }, pointer: [0.5, -0.25] }],
      [3, { nothing: true }],
      [9, { user: { name: 'Me', colour: '#000000' } }],
    ]);
    const peers = peersOf(states, 9);
    expect(peers.map((x) => x.user.name)).toEqual(['Amy', 'Zed']);
    expect(peers[0].pointer).toEqual([0.5, -0.25]);
  });

  it('sends a pointer only when it moved', () => {
    expect(pointerMoved(null, null)).toBe(false);
    expect(pointerMoved(null, [0, 0])).toBe(true);
    expect(pointerMoved([0, 0], [0.00005, 0])).toBe(false);
    expect(pointerMoved([0, 0], [0.001, 0])).toBe(true);
  });
});

describe('connection status', () => {
  it('follows the provider through connecting, live, reconnecting, offline and revoked', () => {
    expect(describeStatus(initialFacts, false).kind).toBe('connecting');
    const live = { ...initialFacts, socket: 'connected' as const, synced: true, role: 'edit' as const };
    expect(describeStatus(live, true).kind).toBe('live');
    expect(describeStatus({ ...live, role: 'view' }, true).kind).toBe('read-only');
    expect(describeStatus({ ...live, socket: 'disconnected', synced: false }, true).kind).toBe('reconnecting');
    expect(describeStatus({ ...live, online: false }, true)).toMatchObject({ kind: 'offline', canRetry: true });
    expect(describeStatus({ ...live, terminal: 4410 }, true)).toMatchObject({ kind: 'revoked', canRetry: false });
    expect(describeStatus({ ...live, terminal: 4404 }, true).kind).toBe('unknown-key');
    expect(describeStatus({ ...live, terminal: 4413 }, true).text).toContain('size limit');
  });

  it('knows the shape of a room key (22 base64url characters, docs/rooms.md)', () => {
    expect(isRoomKey('AAAAAAAAAAAAAAAAAAAAAA')).toBe(true);
    expect(isRoomKey('AAAAAAAAAAAAAAAAAAAAA')).toBe(false);
    expect(isRoomKey('AAAAAAAAAAAAAAAAAAAAA/')).toBe(false);
  });
});

describe('first content and versions', () => {
  it('writes the starting section into an empty room only', () => {
    const doc = new Y.Doc();
    expect(isEmptyRoom(doc)).toBe(true);
    const tpl = templateByName('crawlspace-unvented')!.build();
    expect(initialiseRoom(doc, tpl, 'start')).toBe(true);
    expect(isEmptyRoom(doc)).toBe(false);
    const other = templateByName('slab-edge-break')!.build();
    expect(initialiseRoom(doc, other, 'start')).toBe(false);
    const v = readSection(doc);
    expect(v.ok && v.section.name).toBe(tpl.name);
  });

  it('restores a version by writing only the differences, in one transaction', () => {
    const tpl = templateByName('slab-edge-break')!.build();
    const doc = docFromSnapshot(tpl);
    const saved = Y.encodeStateAsUpdate(doc);
    expect(sectionOfVersion(saved).parts.length).toBe(tpl.parts.length);
    doc.getMap<Y.Map<unknown>>('parts').get('edge')!.set('thickness', 0.01);
    doc.getMap('parts').delete('bed');
    let transactions = 0;
    doc.on('afterTransaction', () => transactions++);
    expect(restoreVersion(doc, saved, 'me')).toBe(2);
    expect(transactions).toBe(1);
    const v = readSection(doc);
    const ref = readSection(docFromSnapshot(tpl));
    expect(v.ok && ref.ok && countDifferences(v.section, ref.section)).toBe(0);
    expect(() => sectionOfVersion(new Uint8Array([1, 2, 3]))).toThrow(/not a readable document|valid section/);
  });
});
