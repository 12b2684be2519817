/**
 * The runs the app keeps in this browser's IndexedDB, one per tab: the run file text (lib/io/runFile.ts,
 * parameters and the whole state) and a few numbers to describe it without reading it. A tab is
 * named by an id in its sessionStorage, which a reload, a crashed tab's restoring and the reopening
 * of a closed tab keep and a new tab does not have: so a reload offers the tab's own run back and a
 * new tab starts afresh. At most MAX_KEPT runs are kept, the oldest dropped first.
 */
const DB_NAME = 'stria-keep';
const DB_VERSION = 1;
const STORE = 'runs';
const BY_TIME = 'savedAt';
const TAB_KEY = 'stria-tab';
export const MAX_KEPT = 4;

export interface SavedRun {
  tab: string;
  /** When it was saved (ms since 1970). */
  savedAt: number;
  /** Model time and step of the state. */
  time: number;
  steps: number;
  /** Whether the run was playing: resuming it plays it again, or leaves it paused. */
  playing: boolean;
  /** The run file (lib/io/runFile.ts), read back with decodeRunFile, which checks it all. */
  text: string;
}

/** This tab's id, made on first use. */
export function tabId(storage: Storage = sessionStorage): string {
  let id = storage.getItem(TAB_KEY);
  if (!id) {
    const bytes = crypto.getRandomValues(new Uint8Array(12));
    id = Array.from(bytes, (b) => b.toString(16).padStart(2, '0')).join('');
    storage.setItem(TAB_KEY, id);
  }
  return id;
}

/** This tab's id, or null where the page may keep nothing (storage disabled, no IndexedDB). */
export function keepingTab(): string | null {
  try {
    return typeof indexedDB === 'undefined' ? null : tabId();
  } catch {
    return null;
  }
}

/** A record read back, if it has the shape written (a store of another version or damaged data reads as none). */
export function asSavedRun(x: unknown): SavedRun | null {
  if (typeof x !== 'object' || x === null) return null;
  const r = x as Record<string, unknown>;
  const num = (k: string) => typeof r[k] === 'number' && Number.isFinite(r[k]);
  if (typeof r.tab !== 'string' || typeof r.text !== 'string' || typeof r.playing !== 'boolean') return null;
  if (!num('savedAt') || !num('time') || !num('steps')) return null;
  return {
    tab: r.tab,
    savedAt: r.savedAt as number,
    time: r.time as number,
    steps: r.steps as number,
    playing: r.playing,
    text: r.text,
  };
}

function openDb(): Promise<IDBDatabase> {
  return new Promise((resolve, reject) => {
    const req = indexedDB.open(DB_NAME, DB_VERSION);
    req.onupgradeneeded = () => {
      const store = req.result.createObjectStore(STORE, { keyPath: 'tab' });
      store.createIndex(BY_TIME, 'savedAt');
    };
    req.onsuccess = () => resolve(req.result);
    req.onerror = () => reject(req.error ?? new Error('IndexedDB could not be opened'));
    req.onblocked = () => reject(new Error('IndexedDB is held by another version of the page'));
  });
}

/** Run `work` in one transaction and settle when it commits (not merely when the requests succeed). */
async function inTransaction<T>(
  mode: IDBTransactionMode,
  work: (store: IDBObjectStore, result: (v: T) => void) => void,
): Promise<T> {
  const db = await openDb();
  try {
    return await new Promise<T>((resolve, reject) => {
      const tx = db.transaction(STORE, mode);
      let value: T;
      work(tx.objectStore(STORE), (v) => (value = v));
      tx.oncomplete = () => resolve(value);
      tx.onerror = () => reject(tx.error ?? new Error('IndexedDB transaction failed'));
      tx.onabort = () => reject(tx.error ?? new Error('IndexedDB transaction aborted (is the disk full?)'));
    });
  } finally {
    db.close();
  }
}

/** Write this tab's run over its last one, and drop the oldest runs beyond MAX_KEPT. */
export function putRun(run: SavedRun): Promise<void> {
  return inTransaction<void>('readwrite', (store) => {
    store.put(run);
    // Walk the keys oldest first without loading the run files, and delete all but the newest MAX_KEPT.
    const count = store.count();
    count.onsuccess = () => {
      let excess = count.result - MAX_KEPT;
      if (excess <= 0) return;
      const cursor = store.index(BY_TIME).openKeyCursor();
      cursor.onsuccess = () => {
        const c = cursor.result;
        if (!c || excess <= 0) return;
        store.delete(c.primaryKey);
        excess--;
        c.continue();
      };
    };
  });
}

/** This tab's kept run, or null. */
export function getRun(tab: string): Promise<SavedRun | null> {
  return inTransaction<SavedRun | null>('readonly', (store, result) => {
    const req = store.get(tab);
    req.onsuccess = () => result(asSavedRun(req.result));
  });
}
