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
 * - styles: style sheets only from the app's files, plus two <style> elements Plotly adds,
 *   allowed by the hash of their exact text: an empty one it fills through the CSS object model
 *   (the chart toolbar's and hover labels' rules; CSSOM calls are not subject to the policy) and
 *   the map traces' fixed sheet, which it adds on load. An injected style element with any other
 *   text is refused, so page-reading CSS selectors cannot be slipped in. Style attributes stay
 *   allowed (`style-src-attr`): Svelte writes `style="…"` in its templates and Plotly sets
 *   positions through them; an attribute cannot hold a selector or load anything, and
 *   connect-src keeps the page from sending anything out. A Plotly upgrade that changes either
 *   text shows as a refused style in the end-to-end tests, which run under this policy.
 * - workers: the app's files and blob: (the analysis worker); images: data:
 *   and blob: (chart snapshots, the icon); downloads of blob: URLs are
 *   handled by the shell, which asks where to save.
 * - everything else off: no plugins, no frames, no forms, no base URL.
 */
export const CONTENT_SECURITY_POLICY = [
  "default-src 'none'",
  "script-src 'self'",
  "style-src 'self'",
  // SHA-256 of "" (Plotly's rule sheet) and of plotly.js-dist-min 4.1.2's map-trace style sheet.
  "style-src-elem 'self' 'sha256-47DEQpj8HBSa+/TImW+5JCeuQeRkm5NMpJWZG3hSuFU=' 'sha256-2GF9hCGTDj/GGFNlQA54jDdMGl2fvoeZmZjAvBSiAtM='",
  "style-src-attr 'unsafe-inline'",
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
