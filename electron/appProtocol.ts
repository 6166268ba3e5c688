/**
 * The renderer is served from a custom protocol, `app://plotrate/…`, rather
 * than file://: a file:// page may read any file:// URL, while this scheme
 * answers only for files inside the built renderer folder (Electron's
 * security checklist, "Avoid usage of the file:// protocol and prefer usage
 * of custom protocols"). The origin doubles as the identity IPC checks.
 */
import path from 'node:path';

/** Scheme of the app's own pages. */
export const APP_SCHEME = 'app';
/** Host part; a fixed name so the origin is the same on every machine. */
export const APP_HOST = 'plotrate';
/** The origin every trusted page has. */
export const APP_ORIGIN = `${APP_SCHEME}://${APP_HOST}`;
/** The page the window loads. */
export const APP_ENTRY_URL = `${APP_ORIGIN}/index.html`;

/**
 * Map a request URL to a file inside the renderer folder.
 *
 * @param url the requested URL, e.g. "app://plotrate/assets/index-3f2a.js"
 * @param rootDir absolute path of the built renderer (dist/renderer)
 * @returns the absolute file path, or null for another origin, an encoded
 *   separator, or a path that would leave rootDir ("../", absolute tricks)
 * @example resolveAppRequest('app://plotrate/', '/opt/plotrate/dist/renderer') // '/opt/plotrate/dist/renderer/index.html'
 */
export function resolveAppRequest(url: string, rootDir: string): string | null {
  let parsed: URL;
  try {
    parsed = new URL(url);
  } catch {
    return null;
  }
  if (parsed.protocol !== `${APP_SCHEME}:` || parsed.host.toLowerCase() !== APP_HOST) return null;
  // Encoded slashes or backslashes could smuggle a separator past URL normalization.
  if (/%2f|%5c|%00/i.test(parsed.pathname)) return null;
  let relative: string;
  try {
    relative = decodeURIComponent(parsed.pathname);
  } catch {
    return null;
  }
  if (relative.includes('\\') || relative.includes('\0')) return null;
  if (relative === '/' || relative === '') relative = '/index.html';
  const root = path.resolve(rootDir);
  const target = path.resolve(root, `.${relative}`);
  const inside = path.relative(root, target);
  if (inside === '' || inside.startsWith('..') || path.isAbsolute(inside)) return null;
  return target;
}

/** Content type by extension for the files Vite emits; anything else is served as bytes. */
export function contentTypeFor(filePath: string): string {
  const types: Record<string, string> = {
    '.html': 'text/html; charset=utf-8',
    '.js': 'text/javascript; charset=utf-8',
    '.mjs': 'text/javascript; charset=utf-8',
    '.css': 'text/css; charset=utf-8',
    '.json': 'application/json',
    '.svg': 'image/svg+xml',
    '.png': 'image/png',
    '.ico': 'image/x-icon',
    '.woff2': 'font/woff2',
    '.woff': 'font/woff',
    '.wasm': 'application/wasm',
    '.map': 'application/json',
    '.csv': 'text/csv; charset=utf-8',
    '.xlsx': 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet',
  };
  return types[path.extname(filePath).toLowerCase()] ?? 'application/octet-stream';
}
