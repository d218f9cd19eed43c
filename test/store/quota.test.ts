// Persistent storage request and quota display, against stand-in StorageManager objects.
import { describe, expect, it } from 'vitest';
import { formatBytes, requestPersistence, storageInfo } from '../../src/store/quota';

const fake = (persisted: boolean, grant: boolean, usage = 1536, quota = 10 * 1024 ** 3) => ({
  persisted: async () => persisted,
  persist: async () => grant,
  estimate: async () => ({ usage, quota }),
});

describe('quota', () => {
  it('asks for persistence only when not already persisted', async () => {
    expect(await requestPersistence(fake(true, false))).toBe(true);
    expect(await requestPersistence(fake(false, true))).toBe(true);
    expect(await requestPersistence(fake(false, false))).toBe(false);
    expect(await requestPersistence(null)).toBeNull();
  });
  it('reports usage and quota, and unknowns as null', async () => {
    expect(await storageInfo(fake(false, false))).toEqual({ persisted: false, usage: 1536, quota: 10 * 1024 ** 3 });
    expect(await storageInfo(null)).toEqual({ persisted: null, usage: null, quota: null });
  });
  it('formats bytes in IEC binary units (IEC 80000-13: 1 KiB = 1024 B)', () => {
    expect(formatBytes(0)).toBe('0 B');
    expect(formatBytes(1536)).toBe('1.5 KiB');
    expect(formatBytes(10 * 1024 ** 3)).toBe('10 GiB');
    expect(formatBytes(300 * 1024 ** 2)).toBe('300 MiB');
    expect(formatBytes(NaN)).toBe('—');
  });
});
