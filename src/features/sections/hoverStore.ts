import { useSyncExternalStore } from 'react';
import type { FrameHover } from './components/SectionFrame';

/**
 * What the pointer (or the station cursor) is over, kept outside React state: the pointer moves
 * many times a second, and only the readout needs to know. Writing it to the screen's state
 * re-rendered both frames (and the T–S and geostrophy panels) on every move.
 */
export interface HoverStore {
  get(): FrameHover | null;
  set(next: FrameHover | null | ((prev: FrameHover | null) => FrameHover | null)): void;
  subscribe(listener: () => void): () => void;
}

export function createHoverStore(): HoverStore {
  let value: FrameHover | null = null;
  const listeners = new Set<() => void>();
  return {
    get: () => value,
    set(next) {
      const v = typeof next === 'function' ? next(value) : next;
      if (v === value || (v && value && v.coord === value.coord && v.x === value.x && v.y === value.y)) return;
      value = v;
      listeners.forEach((l) => l());
    },
    subscribe(listener) {
      listeners.add(listener);
      return () => listeners.delete(listener);
    },
  };
}

/** The hover of a store, re-rendering only the component that reads it. */
export function useHover(store: HoverStore): FrameHover | null {
  return useSyncExternalStore(store.subscribe, store.get, store.get);
}
