/**
 * Keeps the user's work across a reload. A browser has no project file, so the
 * session (source bytes as base64, edits, prices, view) goes to localStorage
 * under one versioned key. A record that cannot be read is set aside under a
 * second key rather than deleted, so nothing the user gave is lost.
 */

/** Where the session lives. */
export const SESSION_KEY = 'plotrate.session.v1';
/** Where an unreadable session is moved to (kept for the user, never read again). */
export const UNREADABLE_KEY = 'plotrate.session.unreadable';

/** The storage calls this module needs (localStorage, or a Map-backed fake in tests). */
export interface KeyValueStore {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

/** Outcome of loading: nothing saved, a session, or a record that could not be read. */
export type LoadResult<T> =
  { kind: 'empty' } | { kind: 'loaded'; session: T } | { kind: 'unreadable'; message: string };

/**
 * Reads the saved session.
 * @param store - localStorage or a fake
 * @param check - returns the session when the parsed JSON has the right shape, else null
 * @returns what was found
 */
export function loadSession<T>(
  store: KeyValueStore,
  check: (data: unknown) => T | null,
): LoadResult<T> {
  const text = store.getItem(SESSION_KEY);
  if (text === null) return { kind: 'empty' };
  try {
    const session = check(JSON.parse(text));
    if (session) return { kind: 'loaded', session };
  } catch {
    // fall through: treated like a record of the wrong shape
  }
  store.setItem(UNREADABLE_KEY, text);
  store.removeItem(SESSION_KEY);
  return {
    kind: 'unreadable',
    message:
      'The work saved in this browser could not be read back, so Plotrate started fresh. ' +
      'The old record is kept in this browser’s storage under "' +
      UNREADABLE_KEY +
      '".',
  };
}

/**
 * Writes the session. A full storage quota is reported, not thrown.
 * @param store - localStorage or a fake
 * @param session - JSON-serializable session
 * @returns null when saved, or a message for the user
 */
export function saveSession(store: KeyValueStore, session: unknown): string | null {
  try {
    store.setItem(SESSION_KEY, JSON.stringify(session));
    return null;
  } catch (error) {
    const why = error instanceof Error ? error.message : String(error);
    return `This browser would not keep your work for the next visit (${why}). Export the workbook to keep it.`;
  }
}

/**
 * Bytes to base64 text, for keeping source files in localStorage.
 * @param bytes - file content
 * @returns base64 text
 * @example
 * bytesToBase64(new Uint8Array([104, 105])) // 'aGk='
 */
export function bytesToBase64(bytes: Uint8Array): string {
  let binary = '';
  const chunk = 0x8000;
  for (let i = 0; i < bytes.length; i += chunk) {
    binary += String.fromCharCode(...bytes.subarray(i, i + chunk));
  }
  return btoa(binary);
}

/**
 * Base64 text back to bytes.
 * @param text - base64 text
 * @returns the bytes
 * @throws {DOMException} when the text is not base64
 * @example
 * base64ToBytes('aGk=') // Uint8Array [104, 105]
 */
export function base64ToBytes(text: string): Uint8Array {
  const binary = atob(text);
  const bytes = new Uint8Array(binary.length);
  for (let i = 0; i < binary.length; i++) bytes[i] = binary.charCodeAt(i);
  return bytes;
}
