'use client';
/** The board with the live physics: the overlay in the stage and the readout in the side column. */
import dynamic from 'next/dynamic';
import { useEffect, useMemo } from 'react';
import type * as Y from 'yjs';
import type { BoardController } from '@/components/board/controller';
import { LiveAside } from './Aside';
import { createLiveOptions } from './options';
import { LiveOverlay } from './Overlay';
import { LiveSession } from './session';

const Board = dynamic(() => import('@/components/board/Board'), { ssr: false, loading: () => <p style={{ padding: 24 }}>Loading the board…</p> });

export default function LiveBoard({ doc, origin, readOnly, onReady }: { doc: Y.Doc; origin: object; readOnly?: boolean; onReady?: (c: BoardController) => void }) {
  const options = useMemo(() => createLiveOptions(), []);
  const live = useMemo(() => new LiveSession(options), [options]);
  useEffect(() => () => live.detach(), [live]);
  return (
    <Board doc={doc} origin={origin} readOnly={readOnly}
      overlay={<LiveOverlay live={live} options={options} />}
      aside={<LiveAside live={live} options={options} />}
      onReady={(c) => { onReady?.(c); live.attach(c); }} />
  );
}
