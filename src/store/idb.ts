/**
 * A small promise wrapper over the browser's IndexedDB: one database ("plumbline"), two object
 * stores (the large autosave and the garage), plain get/put/delete/all. Null where the browser has
 * no IndexedDB (or refuses it: some private modes), so callers fall back or say so.
 */
export const DB_NAME = 'plumbline';
const DB_VERSION = 1;
export type StoreName = 'autosave' | 'garage';

/** The key-value operations used by the autosave and the garage (IndexedDB in the app, a Map in tests). */
export interface AsyncKeyValue {
  get(key: string): Promise<unknown>;
  put(key: string, value: unknown): Promise<void>;
  delete(key: string): Promise<void>;
  /** Every key and value, each read on its own (a value that cannot be read is skipped by the caller). */
  all(): Promise<{ key: string; value: unknown }[]>;
}

let dbPromise: Promise<IDBDatabase> | null = null;

function openDb(): Promise<IDBDatabase> {
  if (dbPromise) return dbPromise;
  dbPromise = new Promise<IDBDatabase>((resolve, reject) => {
    const req = indexedDB.open(DB_NAME, DB_VERSION);
    req.onupgradeneeded = () => {
      const db = req.result;
      for (const name of ['autosave', 'garage'] as const) if (!db.objectStoreNames.contains(name)) db.createObjectStore(name);
    };
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB could not be opened'));
    req.onblocked = () => reject(new Error('IndexedDB is blocked by another tab holding an older version'));
  });
  dbPromise.catch(() => (dbPromise = null));
  return dbPromise;
}

function request<T>(store: StoreName, mode: IDBTransactionMode, op: (s: IDBObjectStore) => IDBRequest<T>): Promise<T> {
  return openDb().then(
    (db) =>
      new Promise<T>((resolve, reject) => {
        const tx = db.transaction(store, mode);
        const req = op(tx.objectStore(store));
        let result: T;
        req.onsuccess = () => (result = req.result);
        tx.oncomplete = () => resolve(result);
        tx.onabort = tx.onerror = () => reject(tx.error ?? req.error ?? new Error('IndexedDB transaction failed'));
      }),
  );
}

/** One object store of the app's database, or null when this browser has no IndexedDB. */
export function idbStore(store: StoreName): AsyncKeyValue | null {
  if (typeof indexedDB === 'undefined') return null;
  return {
    get: (key) => request(store, 'readonly', (s) => s.get(key)),
    put: (key, value) => request(store, 'readwrite', (s) => s.put(value, key)).then(() => undefined),
    delete: (key) => request(store, 'readwrite', (s) => s.delete(key)).then(() => undefined),
    all: async () => {
      const keys = (await request(store, 'readonly', (s) => s.getAllKeys())) as IDBValidKey[];
      const out: { key: string; value: unknown }[] = [];
      for (const k of keys) {
        try {
          out.push({ key: String(k), value: await request(store, 'readonly', (s) => s.get(k)) });
        } catch {
          out.push({ key: String(k), value: undefined });
        }
      }
      return out;
    },
  };
}

/** The same operations over a Map (tests, and a tab where IndexedDB is refused). */
export function memoryKeyValue(map = new Map<string, unknown>()): AsyncKeyValue & { map: Map<string, unknown> } {
  return {
    map,
    get: async (k) => (map.has(k) ? structuredClone(map.get(k)) : undefined),
    put: async (k, v) => void map.set(k, structuredClone(v)),
    delete: async (k) => void map.delete(k),
    all: async () => [...map.entries()].map(([key, value]) => ({ key, value: structuredClone(value) })),
  };
}
