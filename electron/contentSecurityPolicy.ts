/**
 * The Content-Security-Policy every app page gets, sent as a response header
 * by the app:// protocol handler (the preferred way in Electron's security
 * checklist, item "Define a Content-Security-Policy").
 *
 * - scripts: only the app's own files. No 'unsafe-eval': plotly.js-dist-min
 *   4.1.2 evaluates strings only in fallbacks a current Chromium never takes
 *   (a `Function("return this")` after globalThis, the function-bind polyfill)
 *   and in the map traces' worker loader, which Plotrate does not use. If a
 *   chart type ever needs it, it shows as a CSP error in the log, not silently.
 * - styles: 'self' plus 'unsafe-inline', because Plotly and Svelte set style
 *   attributes on elements. Inline style cannot run script; with no remote
 *   content and connect-src limited to the app, the remaining risk (CSS that
 *   reads the page) has nowhere to send what it reads.
 * - workers: the app's files and blob: (the analysis worker); images: data:
 *   and blob: (chart snapshots, the icon); downloads of blob: URLs are
 *   handled by the shell, which asks where to save.
 * - everything else off: no plugins, no frames, no forms, no base URL.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'none'",
  "script-src 'self'",
  "style-src 'self' 'unsafe-inline'",
  "img-src 'self' data: blob:",
  "font-src 'self' data:",
  "connect-src 'self' blob: data:",
  "worker-src 'self' blob:",
  "child-src 'self' blob:",
  "manifest-src 'self'",
  "object-src 'none'",
  "frame-src 'none'",
  "frame-ancestors 'none'",
  "base-uri 'none'",
  "form-action 'none'",
].join('; ');

/**
 * Split a policy into directive name → sources, for checks and tests.
 * @example parsePolicy("script-src 'self'")['script-src'] // ["'self'"]
 */
export function parsePolicy(policy: string): Record<string, string[]> {
  const out: Record<string, string[]> = {};
  for (const part of policy.split(';')) {
    const [name, ...sources] = part.trim().split(/\s+/);
    if (name) out[name] = sources;
  }
  return out;
}
