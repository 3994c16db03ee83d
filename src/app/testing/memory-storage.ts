import type { OfflineStorage } from '../core/offline-store';

/**
 * The browser's IndexedDB is not in jsdom: the offline store's four calls over a Map, so what a
 * spec's queue keeps, sends and forgets can be read back.
 */
export function memoryStorage(): OfflineStorage & { map: Map<string, unknown> } {
  const map = new Map<string, unknown>();
  return {
    map,
    all: async (userId) =>
      [...map.entries()]
        .filter(([k]) => k.startsWith(`${userId}:`))
        .sort(([a], [b]) => (a < b ? -1 : 1)),
    put: async (key, value) => void map.set(key, JSON.parse(JSON.stringify(value))),
    remove: async (key) => void map.delete(key),
    removeUser: async (userId) => {
      for (const key of [...map.keys()]) if (key.startsWith(`${userId}:`)) map.delete(key);
    },
  };
}
