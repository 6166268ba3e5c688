/**
 * Lock down the session and every web contents: permissions denied, no
 * navigation away from the app, no new windows, no <webview>, downloads only
 * of the page's own blob:/data: URLs. Written against Electron's types but
 * taking the objects as arguments, so the decisions are plain functions.
 */
import type { Event, Session, WebContents, WebPreferences } from 'electron';
import { APP_HOST, APP_SCHEME } from './appProtocol';

/** Whether a URL is one of the app's own pages (parsed, not prefix-matched). */
export function isAppUrl(url: string): boolean {
  try {
    const u = new URL(url);
    return u.protocol === `${APP_SCHEME}:` && u.host.toLowerCase() === APP_HOST;
  } catch {
    return false;
  }
}

/** Whether the page may start a download of this URL: only what it made itself. */
export function isAllowedDownload(url: string): boolean {
  return url.startsWith('blob:app://plotrate/') || url.startsWith('data:');
}

/**
 * Deny every permission request and check (camera, notifications, clipboard
 * reading, geolocation, USB, HID, serial…): Plotrate needs none of them, and
 * Electron grants them all unless told otherwise.
 */
export function denyAllPermissions(session: Session): void {
  session.setPermissionRequestHandler((_contents, _permission, callback) => callback(false));
  session.setPermissionCheckHandler(() => false);
  session.setDevicePermissionHandler(() => false);
  session.setDisplayMediaRequestHandler((_request, callback) => callback({}));
}

/**
 * Let only the page's own blob:/data: downloads through (the native save dialog asks where);
 * anything else is cancelled.
 */
export function limitDownloads(session: Session): void {
  session.on('will-download', (event, item) => {
    if (!isAllowedDownload(item.getURL())) event.preventDefault();
  });
}

/**
 * Guard one web contents: navigation stays on the app's pages, window.open and
 * target=_blank open nothing, <webview> cannot attach.
 */
export function guardWebContents(contents: WebContents): void {
  const stayHome = (event: Event, url: string) => {
    if (!isAppUrl(url)) event.preventDefault();
  };
  contents.on('will-navigate', (event) => stayHome(event, event.url));
  contents.on('will-frame-navigate', (event) => stayHome(event, event.url));
  contents.on('will-redirect', (event) => stayHome(event, event.url));
  contents.setWindowOpenHandler(() => ({ action: 'deny' }));
  contents.on('will-attach-webview', (event, webPreferences: WebPreferences) => {
    delete webPreferences.preload;
    event.preventDefault();
  });
}
