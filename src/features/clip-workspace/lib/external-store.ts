import { useCallback, useRef, useSyncExternalStore } from 'react';

/**
 * A value that changes often and lives outside React state (the playback clock, the pose of the frame
 * on screen). Components read slices of it with useStoreSlice and re-render only when their slice
 * changes; code outside React reads it with get() at the moment it needs it.
 */
export class ExternalStore<T extends object> {
  private state: T;
  private readonly listeners = new Set<() => void>();

  constructor(initial: T) {
    this.state = initial;
  }

  get = (): T => this.state;

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => {
      this.listeners.delete(listener);
    };
  };

  /** Merges a change and tells subscribers, only when a field really changed. */
  set(patch: Partial<T>): void {
    const keys = Object.keys(patch) as (keyof T)[];
    if (keys.every((k) => Object.is(patch[k], this.state[k]))) return;
    this.state = { ...this.state, ...patch };
    for (const listener of this.listeners) listener();
  }
}

/** The selected slice of a store; re-renders only when it changes (Object.is). */
export function useStoreSlice<T extends object, S>(store: ExternalStore<T>, select: (state: T) => S): S {
  // The latest selector is read at snapshot time, so an inline arrow does not resubscribe.
  const selectRef = useRef(select);
  selectRef.current = select;
  const getSnapshot = useCallback(() => selectRef.current(store.get()), [store]);
  return useSyncExternalStore(store.subscribe, getSnapshot, getSnapshot);
}
