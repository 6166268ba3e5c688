import { describe, expect, it } from 'vitest';
import {
  base64ToBytes,
  bytesToBase64,
  loadSession,
  saveSession,
  SESSION_KEY,
  UNREADABLE_KEY,
  type KeyValueStore,
} from '../renderer/src/lib/persistence';

function memoryStore(): KeyValueStore & { data: Map<string, string> } {
  const data = new Map<string, string>();
  return {
    data,
    getItem: (k) => data.get(k) ?? null,
    setItem: (k, v) => void data.set(k, v),
    removeItem: (k) => void data.delete(k),
  };
}
const isSession = (d: unknown) =>
  typeof d === 'object' && d !== null && 'step' in d ? (d as { step: string }) : null;

describe('renderer persistence', () => {
  it('a saved session loads back equal', () => {
    const store = memoryStore();
    expect(saveSession(store, { step: 'prices' })).toBeNull();
    expect(loadSession(store, isSession)).toEqual({ kind: 'loaded', session: { step: 'prices' } });
  });

  it('nothing saved is "empty"', () => {
    expect(loadSession(memoryStore(), isSession)).toEqual({ kind: 'empty' });
  });

  it('an unreadable record is set aside, not deleted, and explained', () => {
    const store = memoryStore();
    store.setItem(SESSION_KEY, '{not json');
    const result = loadSession(store, isSession);
    expect(result.kind).toBe('unreadable');
    expect(store.data.get(UNREADABLE_KEY)).toBe('{not json');
    expect(store.data.has(SESSION_KEY)).toBe(false);
  });

  it('a full quota is a message, not a throw', () => {
    const store = memoryStore();
    store.setItem = () => {
      throw new Error('QuotaExceededError');
    };
    expect(saveSession(store, { step: 'files' })).toMatch(/would not keep your work/);
  });

  it('bytes survive base64 both ways, including large files', () => {
    const bytes = new Uint8Array(100_000).map((_, i) => (i * 31) % 256);
    expect(base64ToBytes(bytesToBase64(bytes))).toEqual(bytes);
    expect(bytesToBase64(new Uint8Array([104, 105]))).toBe('aGk=');
  });
});
