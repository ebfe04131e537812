import { useSyncExternalStore } from 'react';
import type { LiveSnapshot, LiveStore } from './live-store';

/** The run view and link state of a live store; re-renders only when those change, never per sample. */
export function useLiveSnapshot(store: LiveStore): LiveSnapshot {
  return useSyncExternalStore(store.subscribe, store.getSnapshot);
}
