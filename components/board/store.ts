/** A tiny external store: the board's state lives outside React so a pointer move re-renders only what reads it. */
import { useRef, useSyncExternalStore } from 'react';

export interface Store<T> {
  get(): T;
  set(next: T | ((prev: T) => T)): void;
  subscribe(fn: () => void): () => void;
}

export function createStore<T>(initial: T): Store<T> {
  let value = initial;
  const subs = new Set<() => void>();
  return {
    get: () => value,
    set(next) {
      const v = typeof next === 'function' ? (next as (p: T) => T)(value) : next;
      if (Object.is(v, value)) return;
      value = v;
      for (const fn of [...subs]) fn();
    },
    subscribe(fn) {
      subs.add(fn);
      return () => subs.delete(fn);
    },
  };
}

export function useStore<T>(store: Store<T>): T {
  return useSyncExternalStore(store.subscribe, store.get, store.get);
}

/**
 * `value`'s fields `keys`, as the same object as `prev` when none of them changed (Object.is), else a
 * new object: a stable snapshot for useSyncExternalStore.
 */
export function pickIfChanged<T extends object, K extends keyof T>(prev: Pick<T, K> | null, value: T, keys: readonly K[]): Pick<T, K> {
  if (prev && keys.every((k) => Object.is(prev[k], value[k]))) return prev;
  const next = {} as Pick<T, K>;
  for (const k of keys) next[k] = value[k];
  return next;
}

/** Some fields of a store: the component re-renders only when one of them changes. */
export function useStoreFields<T extends object, K extends keyof T>(store: Store<T>, keys: readonly K[]): Pick<T, K> {
  const last = useRef<Pick<T, K> | null>(null);
  const get = () => (last.current = pickIfChanged(last.current, store.get(), keys));
  return useSyncExternalStore(store.subscribe, get, get);
}
