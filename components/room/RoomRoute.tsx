'use client';
/** /s/<key>: the room page, rendered in the browser only (it opens a websocket and IndexedDB). */
import dynamic from 'next/dynamic';

const RoomPage = dynamic(() => import('./RoomPage'), { ssr: false, loading: () => <p style={{ padding: 24 }}>Opening the shared section…</p> });

export function RoomRoute({ roomKey }: { roomKey: string }) {
  return <RoomPage roomKey={roomKey} />;
}
