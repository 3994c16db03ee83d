import { InjectionToken } from '@angular/core';
import { createStore, del, delMany, entries, set, type UseStore } from 'idb-keyval';

/**
 * What a signed-in person typed while the server could not be reached, kept in this browser's
 * IndexedDB until it is sent. Keys are `<user id>:<order>` so one person's entries are read, sent
 * and forgotten apart from another's on a shared tablet.
 */
export interface OfflineStorage {
  all(userId: string): Promise<[string, unknown][]>;
  put(key: string, value: unknown): Promise<void>;
  remove(key: string): Promise<void>;
  removeUser(userId: string): Promise<void>;
}

let store: UseStore | null = null;
function idb(): UseStore {
  store ??= createStore('stepstock-offline', 'entries');
  return store;
}

function mine(userId: string, key: IDBValidKey): key is string {
  return typeof key === 'string' && key.startsWith(`${userId}:`);
}

export const idbOfflineStorage: OfflineStorage = {
  async all(userId) {
    const found = await entries<IDBValidKey, unknown>(idb());
    return found
      .filter((pair): pair is [string, unknown] => mine(userId, pair[0]))
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  },
  put: (key, value) => set(key, value, idb()),
  remove: (key) => del(key, idb()),
  async removeUser(userId) {
    const found = await entries<IDBValidKey, unknown>(idb());
    await delMany(
      found.map(([key]) => key).filter((key) => mine(userId, key)),
      idb(),
    );
  },
};

/** Where the bench keeps what waits to be sent; a spec may hand in its own. */
export const OFFLINE_STORAGE = new InjectionToken<OfflineStorage>('OFFLINE_STORAGE', {
  providedIn: 'root',
  factory: () => idbOfflineStorage,
});

/**
 * Empties the service worker's copies of API answers (its data groups, ngsw-config.json), so the
 * next person on this tablet cannot read the last one's jobs offline. Entries are deleted rather
 * than the caches themselves: the running worker keeps its caches open and would go on using them.
 */
export async function clearCachedAnswers(): Promise<void> {
  if (typeof caches === 'undefined') return;
  const names = (await caches.keys()).filter((name) => name.includes(':data:'));
  await Promise.all(
    names.map(async (name) => {
      const cache = await caches.open(name);
      const requests = await cache.keys();
      await Promise.all(requests.map((request) => cache.delete(request)));
    }),
  );
}
