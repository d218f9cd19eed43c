/**
 * Persistent storage and quota. Browsers may evict an origin's data under storage pressure unless
 * the origin holds persistent storage; the app asks once at start (`navigator.storage.persist()`),
 * and the library shows used / available space from `navigator.storage.estimate()`.
 */
export interface StorageInfo {
  /** true: the browser will not evict the cases without asking the user; null: unknown */
  persisted: boolean | null;
  usage: number | null;
  quota: number | null;
}

type StorageManagerLike = Pick<StorageManager, 'persist' | 'persisted' | 'estimate'>;

function manager(): StorageManagerLike | null {
  const nav = (globalThis as { navigator?: { storage?: StorageManagerLike } }).navigator;
  return nav?.storage && typeof nav.storage.estimate === 'function' ? nav.storage : null;
}

/** Ask for persistent storage (a no-op where the API is missing). */
export async function requestPersistence(m: StorageManagerLike | null = manager()): Promise<boolean | null> {
  if (!m) return null;
  try {
    if (await m.persisted()) return true;
    return await m.persist();
  } catch {
    return null;
  }
}

export async function storageInfo(m: StorageManagerLike | null = manager()): Promise<StorageInfo> {
  if (!m) return { persisted: null, usage: null, quota: null };
  try {
    const [persisted, est] = await Promise.all([m.persisted().catch(() => null), m.estimate()]);
    return { persisted, usage: est.usage ?? null, quota: est.quota ?? null };
  } catch {
    return { persisted: null, usage: null, quota: null };
  }
}

/** Bytes in binary units for display: 1 KiB = 1024 B (IEC 80000-13). */
export function formatBytes(n: number): string {
  if (!Number.isFinite(n) || n < 0) return '—';
  const units = ['B', 'KiB', 'MiB', 'GiB', 'TiB'];
  let i = 0;
  let v = n;
  while (v >= 1024 && i < units.length - 1) {
    v /= 1024;
    i++;
  }
  return `${i === 0 ? v.toFixed(0) : v.toFixed(v < 10 ? 1 : 0)} ${units[i]}`;
}
