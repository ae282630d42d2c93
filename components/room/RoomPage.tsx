'use client';
/**
 * A shared section at /s/<key>. The key alone decides the role (the server says which): an edit key
 * gets the editable board, links, key rotation, history and a local copy in IndexedDB; a view key gets
 * the same section live on a read-only board. Exposes the document for tests as window.__dewline.
 */
import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import * as Y from 'yjs';
import type { WebsocketProvider } from 'y-websocket';
import type { BoardController } from '@/components/board/controller';
import LiveBoard from '@/components/live/LiveBoard';
import { boardTestHook } from '@/components/board/test-hook';
import { lookupKey, RoomApiError, rotateKey, type Role } from '@/lib/collab/api';
import { initialiseRoom, isEmptyRoom, pendingKey } from '@/lib/collab/initial';
import { cleanName, colourForClient, defaultName, peersOf, pointerMoved, type Peer } from '@/lib/collab/presence';
import { joinRoom, syncUrlFor } from '@/lib/collab/provider';
import { describeStatus, initialFacts, type ConnectionFacts } from '@/lib/collab/status';
import { readSection } from '@/lib/section/doc';
import { parseSectionText } from '@/lib/section/validate';
import { HistoryPanel } from './HistoryPanel';
import { LinksBar } from './LinksBar';
import { PeerLayer } from './PeerLayer';
import css from './room.module.css';

export const NAME_KEY = 'dewline:name';
const ROLE_PREFIX = 'dewline:role:';

type Phase = { kind: 'lookup' } | { kind: 'unknown' } | { kind: 'error'; text: string } | { kind: 'ready'; role: Role; viewKey: string | null };

function storedName(): string | null {
  try {
    return cleanName(localStorage.getItem(NAME_KEY));
  } catch {
    return null;
  }
}

/** The role of a key: asked of the server, remembered for an edit key so the page also opens offline. */
async function roleOf(key: string): Promise<{ role: Role; viewKey: string | null } | 'unknown'> {
  try {
    const r = await lookupKey(key);
    if (r.role === 'edit') localStorage.setItem(ROLE_PREFIX + key, JSON.stringify({ role: 'edit', viewKey: r.viewKey ?? null }));
    return { role: r.role, viewKey: r.viewKey ?? null };
  } catch (err) {
    if (err instanceof RoomApiError && err.status === 404) {
      localStorage.removeItem(ROLE_PREFIX + key);
      return 'unknown';
    }
    const remembered = localStorage.getItem(ROLE_PREFIX + key);
    if (remembered) return JSON.parse(remembered) as { role: Role; viewKey: string | null };
    throw err;
  }
}

export default function RoomPage({ roomKey }: { roomKey: string }) {
  const [phase, setPhase] = useState<Phase>({ kind: 'lookup' });
  useEffect(() => {
    let stop = false;
    roleOf(roomKey).then(
      (r) => !stop && setPhase(r === 'unknown' ? { kind: 'unknown' } : { kind: 'ready', ...r }),
      (err: unknown) => !stop && setPhase({ kind: 'error', text: (err as Error).message }),
    );
    return () => {
      stop = true;
    };
  }, [roomKey]);
  if (phase.kind === 'lookup') return <p className={css.centre}>Opening the shared section…</p>;
  if (phase.kind === 'unknown')
    return (
      <main className={css.centre} data-testid="room-unknown">
        <h1 style={{ fontSize: 20 }}>This link does not open a section</h1>
        <p>It may be mistyped, or someone with the edit link replaced it with a new one. Ask them for the current link.</p>
        <p><a href="/">Back to the start page</a></p>
      </main>
    );
  if (phase.kind === 'error')
    return (
      <main className={css.centre} data-testid="room-error">
        <h1 style={{ fontSize: 20 }}>The shared section cannot be opened</h1>
        <p>{phase.text}</p>
        <p><button type="button" onClick={() => window.location.reload()}>Try again</button></p>
      </main>
    );
  return <Room roomKey={roomKey} role={phase.role} initialViewKey={phase.viewKey} />;
}

function Room({ roomKey, role, initialViewKey }: { roomKey: string; role: Role; initialViewKey: string | null }) {
  const doc = useMemo(() => new Y.Doc(), []);
  const origin = useMemo(() => ({ who: 'room person', clientId: doc.clientID }), [doc]);
  const [facts, setFacts] = useState<ConnectionFacts>({ ...initialFacts, role, online: typeof navigator === 'undefined' ? true : navigator.onLine });
  const [everSynced, setEverSynced] = useState(false);
  const [contentReady, setContentReady] = useState(false);
  const [provider, setProvider] = useState<WebsocketProvider | null>(null);
  const [controller, setController] = useState<BoardController | null>(null);
  const [canvas, setCanvas] = useState<HTMLElement | null>(null);
  const [peers, setPeers] = useState<Peer[]>([]);
  const [name, setName] = useState(() => storedName() ?? defaultName(doc.clientID));
  const [viewKey, setViewKey] = useState(initialViewKey);
  const [history, setHistory] = useState(false);
  const [note, setNote] = useState<string | null>(null);
  const colour = colourForClient(doc.clientID);
  const factsRef = useRef(facts);
  factsRef.current = facts;
  const leaving = useRef(false);

  // connection, local copy and first content
  useEffect(() => {
    let stopped = false;
    let idb: { destroy(): Promise<void>; whenSynced: Promise<unknown> } | null = null;
    let prov: WebsocketProvider | null = null;
    const patch = (p: Partial<ConnectionFacts>) => !stopped && setFacts((f) => ({ ...f, ...p }));
    const startWithPending = () => {
      if (role !== 'edit') return;
      let text: string | null = null;
      try {
        text = sessionStorage.getItem(pendingKey(roomKey));
      } catch {
        text = null;
      }
      if (text === null) return;
      const v = parseSectionText(text);
      if (v.ok) initialiseRoom(doc, v.section, 'room start');
      sessionStorage.removeItem(pendingKey(roomKey));
    };
    const onOffline = () => {
      patch({ online: false });
      prov?.disconnect();
    };
    const onOnline = () => {
      patch({ online: true });
      if (factsRef.current.terminal === null) prov?.connect();
    };
    window.addEventListener('offline', onOffline);
    window.addEventListener('online', onOnline);
    void (async () => {
      if (role === 'edit') {
        const { IndexeddbPersistence } = await import('y-indexeddb');
        if (stopped) return;
        const p = new IndexeddbPersistence(`dewline-room:${roomKey}`, doc);
        idb = p;
        try {
          await p.whenSynced;
        } catch {
          // no IndexedDB (private mode): the page works, without a local copy
        }
        if (stopped) return;
        if (!isEmptyRoom(doc)) setContentReady(true);
      }
      prov = joinRoom(doc, roomKey, { syncUrl: syncUrlFor(window.location), onRole: (r) => patch({ role: r }), connect: navigator.onLine });
      prov.on('status', ({ status }: { status: 'connecting' | 'connected' | 'disconnected' }) => patch({ socket: status, ...(status === 'connected' ? { terminal: null } : {}) }));
      prov.on('sync', (synced: boolean) => {
        patch({ synced });
        if (!synced || stopped) return;
        startWithPending();
        setEverSynced(true);
        setContentReady(true);
      });
      prov.on('closed', (c: { code: number }) => {
        if (!leaving.current) patch({ terminal: c.code, synced: false });
      });
      setProvider(prov);
    })();
    return () => {
      stopped = true;
      window.removeEventListener('offline', onOffline);
      window.removeEventListener('online', onOnline);
      prov?.destroy();
      void idb?.destroy();
      // the doc is not destroyed here: React's strict mode (dev) runs this effect twice on one doc
    };
  }, [doc, role, roomKey]);

  // presence: my name and colour, everyone else's state
  useEffect(() => {
    if (!provider) return;
    const aw = provider.awareness;
    aw.setLocalStateField('user', { name, colour });
    try {
      localStorage.setItem(NAME_KEY, name);
    } catch {
      // storage refused: the name lasts for this page only
    }
  }, [provider, name, colour]);
  useEffect(() => {
    if (!provider) return;
    const aw = provider.awareness;
    const onChange = () => setPeers(peersOf(aw.getStates(), doc.clientID));
    aw.on('change', onChange);
    onChange();
    return () => aw.off('change', onChange);
  }, [provider, doc]);

  // my selection and pointer
  useEffect(() => {
    if (!provider || !controller) return;
    const aw = provider.awareness;
    let last = controller.ui.get().selection;
    aw.setLocalStateField('selection', { parts: [...last.parts], zones: [...last.zones] });
    return controller.ui.subscribe(() => {
      const sel = controller.ui.get().selection;
      if (sel === last) return;
      last = sel;
      aw.setLocalStateField('selection', { parts: [...sel.parts], zones: [...sel.zones] });
    });
  }, [provider, controller]);
  useEffect(() => {
    if (!provider || !controller || !canvas) return;
    const aw = provider.awareness;
    let sent: [number, number] | null = null;
    let lastAt = 0;
    let timer = 0;
    const publish = (p: [number, number] | null) => {
      if (!pointerMoved(sent, p)) return;
      sent = p;
      lastAt = performance.now();
      aw.setLocalStateField('pointer', p);
    };
    const move = (e: PointerEvent) => {
      const r = canvas.getBoundingClientRect();
      const w = controller.toWorld(e.clientX - r.left, e.clientY - r.top);
      const p: [number, number] = [Math.round(w[0] * 1e4) / 1e4, Math.round(w[1] * 1e4) / 1e4];
      window.clearTimeout(timer);
      // at most about 20 pointer messages a second; the last position always goes out
      if (performance.now() - lastAt >= 50) publish(p);
      else timer = window.setTimeout(() => publish(p), 50);
    };
    const leave = () => {
      window.clearTimeout(timer);
      publish(null);
    };
    canvas.addEventListener('pointermove', move);
    canvas.addEventListener('pointerleave', leave);
    return () => {
      window.clearTimeout(timer);
      canvas.removeEventListener('pointermove', move);
      canvas.removeEventListener('pointerleave', leave);
    };
  }, [provider, controller, canvas]);

  // the page title follows the section's name (the room's name)
  useEffect(() => {
    if (!controller) return;
    const set = () => {
      document.title = `${controller.settled.get().snapshot.name} · Dewline${role === 'view' ? ' (view)' : ''}`;
    };
    set();
    return controller.settled.subscribe(set);
  }, [controller, role]);

  const status = describeStatus(facts, everSynced);
  const readOnly = role === 'view' || facts.terminal === 4410 || facts.terminal === 4404;

  const onReady = useCallback(
    (c: BoardController) => {
      setController(c);
      setCanvas(document.querySelector('[data-testid="board-canvas"]') as HTMLElement | null);
      window.__dewline = Object.assign(window.__dewline ?? {}, boardTestHook(doc, c), {
        role,
        status: () => factsRef.current,
      });
    },
    [doc, role],
  );

  const rotate = async (which: Role) => {
    setNote(null);
    try {
      if (which === 'edit') leaving.current = true;
      const keys = await rotateKey(roomKey, which);
      if (which === 'edit') {
        try {
          localStorage.removeItem(ROLE_PREFIX + roomKey);
        } catch {
          // nothing remembered
        }
        window.location.replace(`/s/${keys.editKey}`);
        return;
      }
      setViewKey(keys.viewKey);
      setNote('New view link made: the old view link no longer opens this section.');
    } catch (err) {
      leaving.current = false;
      setNote(`The link could not be replaced: ${(err as Error).message}`);
    }
  };

  const kindClass = { live: css.live, 'read-only': css.readonly, connecting: css.connecting, reconnecting: css.reconnecting, offline: css.offline, revoked: css.revoked, 'unknown-key': css.unknown, refused: css.refused }[status.kind];

  return (
    <div className={css.room} data-testid="room" data-role={role}>
      <div className={css.bar}>
        <a href="/" className={css.home} title="Start page">Dewline</a>
        <span className={`${css.status} ${kindClass}`} data-testid="connection" data-status={status.kind} role="status">
          <span className={css.dot} />
          {status.text}
        </span>
        {status.canRetry && (
          <button type="button" data-testid="reconnect" onClick={() => provider?.connect()}>
            Reconnect
          </button>
        )}
        <div className={`${css.group} ${css.people}`} data-testid="people" aria-label="Who is here">
          <input
            className={css.me}
            style={{ borderColor: colour }}
            aria-label="Your name"
            data-testid="my-name"
            defaultValue={name}
            maxLength={40}
            onBlur={(e) => {
              const n = cleanName(e.target.value) ?? defaultName(doc.clientID);
              e.target.value = n;
              setName(n);
            }}
            onKeyDown={(e) => e.key === 'Enter' && (e.target as HTMLInputElement).blur()}
          />
          {peers.map((p) => (
            <span key={p.clientId} className={css.chip} style={{ background: p.user.colour }} data-testid="person" title={p.user.name}>
              {p.user.name}
            </span>
          ))}
        </div>
        {role === 'edit' && <LinksBar editKey={roomKey} viewKey={viewKey} onRotate={rotate} />}
        <div className={css.group}>
          {role === 'edit' && (
            <button type="button" data-testid="history" aria-pressed={history} onClick={() => setHistory((h) => !h)} disabled={!controller}>
              History
            </button>
          )}
          <a className={css.btn} href={`/sheet?key=${encodeURIComponent(roomKey)}`} data-testid="sheet-link" target="_blank" rel="noopener">
            Sheet
          </a>
        </div>
        {note && <span className={css.note} data-testid="room-note">{note}</span>}
      </div>
      {(status.kind === 'revoked' || status.kind === 'unknown-key') && (
        <div className={css.banner} role="alert" data-testid="revoked">
          {status.text} The board shows the section as it was and accepts no edits. Ask someone with the edit link for the current link.
        </div>
      )}
      <div className={css.slot}>
        {contentReady ? (
          <LiveBoard doc={doc} origin={origin} readOnly={readOnly} onReady={onReady} />
        ) : (
          <p className={css.centre}>{status.kind === 'offline' ? 'Offline, and this browser holds no copy of the section yet.' : 'Fetching the section…'}</p>
        )}
        {history && controller && role === 'edit' && <HistoryPanel editKey={roomKey} controller={controller} onClose={() => setHistory(false)} />}
        {controller && canvas && <PeerLayer controller={controller} peers={peers} container={canvas} />}
      </div>
    </div>
  );
}
