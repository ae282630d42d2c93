/** What the live layers show (local to this viewer). */
import { createStore } from '@/components/board/store';
import type { Store } from '@/components/board/store';

export interface LiveOptionsState { colours: boolean; isotherms: boolean; step: number; flow: boolean }
export type LiveOptions = Store<LiveOptionsState>;
export function createLiveOptions(): LiveOptions {
  return createStore<LiveOptionsState>({ colours: true, isotherms: true, step: 2, flow: false });
}
