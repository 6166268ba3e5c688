import { APP_HOST, APP_SCHEME } from './appProtocol';

/** The part of an IPC event's sender frame the check reads (Electron's WebFrameMain). */
export interface SenderFrameLike {
  url: string;
  /** The parent frame, null for a window's main frame. */
  parent: unknown;
}

/**
 * Whether an IPC message comes from the app's own page: the main frame of a
 * window whose URL has the app:// origin. Parsed with URL rather than compared
 * as text, so "app://plotrate.evil/" does not pass (Electron's security
 * checklist, "Validate the sender of all IPC messages").
 *
 * @param frame event.senderFrame; null when the frame has gone
 * @example isAppSender({ url: 'app://plotrate/index.html', parent: null }) // true
 */
export function isAppSender(frame: SenderFrameLike | null | undefined): boolean {
  if (!frame || frame.parent !== null || typeof frame.url !== 'string') return false;
  try {
    const url = new URL(frame.url);
    // Node's URL gives a custom scheme the origin "null" and keeps the host's case
    // (Chromium lowers it for a standard scheme), so compare scheme and lower-cased host.
    return (
      url.protocol === `${APP_SCHEME}:` &&
      url.host.toLowerCase() === APP_HOST &&
      url.username === ''
    );
  } catch {
    return false;
  }
}
