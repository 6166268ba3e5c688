// The desktop shell against Electron's security checklist (the "Security"
// tutorial in Electron's documentation, items numbered as there). Each check
// tests the object or function the shell really uses.
import { EventEmitter } from 'node:events';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import { mkdtemp, readFile, rm } from 'node:fs/promises';
import os from 'node:os';
import path from 'node:path';
import vm from 'node:vm';
import { build } from 'esbuild';
import type { Session, WebContents } from 'electron';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { APP_ENTRY_URL, resolveAppRequest } from '../electron/appProtocol';
import { CONTENT_SECURITY_POLICY, parsePolicy } from '../electron/contentSecurityPolicy';
import { IPC, IPC_EVENTS } from '../electron/ipcChannels';
import { isAppSender } from '../electron/senderCheck';
import {
  denyAllPermissions,
  guardWebContents,
  isAllowedDownload,
  isAppUrl,
} from '../electron/sessionPolicy';
import { buildWindowOptions } from '../electron/windowOptions';

const root = path.join(import.meta.dirname, '..');

describe('window options (checklist items 2, 3, 4, 6, 8, 9, 10, 11/12)', () => {
  const options = buildWindowOptions(
    '/opt/plotrate/dist-electron/preload.cjs',
    '/opt/plotrate/icon.png',
    '1.2.3',
    false,
  );
  const web = options.webPreferences!;
  it('keep Node out of the page and isolate the preload', () => {
    expect(web.nodeIntegration).toBe(false);
    expect(web.nodeIntegrationInWorker).toBe(false);
    expect(web.nodeIntegrationInSubFrames).toBe(false);
    expect(web.contextIsolation).toBe(true);
    expect(web.sandbox).toBe(true);
  });
  it('keep web security on and insecure content, experimental and Blink features off', () => {
    expect(web.webSecurity).toBe(true);
    expect(web.allowRunningInsecureContent).toBe(false);
    expect(web.experimentalFeatures).toBe(false);
    expect(web.enableBlinkFeatures).toBeUndefined();
    expect(web.webviewTag).toBe(false);
    expect(web.navigateOnDragDrop).toBe(false);
  });
  it('open the developer tools only in a development run, never in a packaged app', () => {
    expect(web.devTools).toBe(false);
    const dev = buildWindowOptions('/p/preload.cjs', '/p/icon.png', '1.2.3', true);
    expect(dev.webPreferences!.devTools).toBe(true);
  });
  it('load the one bundled preload by absolute path and pass the version as a switch', () => {
    expect(path.isAbsolute(web.preload!)).toBe(true);
    expect(web.additionalArguments).toEqual(['--plotrate-version=1.2.3']);
  });
});

describe('Content-Security-Policy (item 7)', () => {
  const policy = parsePolicy(CONTENT_SECURITY_POLICY);
  it("allows scripts from the app only: no 'unsafe-eval', no 'unsafe-inline', no hosts", () => {
    expect(policy['script-src']).toEqual(["'self'"]);
    expect(policy['default-src']).toEqual(["'none'"]);
  });
  it("allows no inline style element but two of Plotly's, each by the hash of its exact text", () => {
    for (const name of ['style-src', 'style-src-elem']) {
      expect(policy[name], name).not.toContain("'unsafe-inline'");
      expect(policy[name], name).toContain("'self'");
    }
    // The texts as the installed plotly.js-dist-min adds them: an empty sheet it fills through
    // the CSS object model, and the map traces' sheet, a string literal in the bundle.
    const bundle = readFileSync(
      createRequire(import.meta.url).resolve('plotly.js-dist-min'),
      'utf8',
    );
    const start = bundle.indexOf("textContent='.maplibregl-map") + "textContent='".length;
    const mapSheet = bundle.slice(start, bundle.indexOf("'", start));
    const hash = (text: string) => `'sha256-${createHash('sha256').update(text).digest('base64')}'`;
    expect(policy['style-src-elem'].filter((s) => s.startsWith("'sha256-")).sort()).toEqual(
      [hash(''), hash(mapSheet)].sort(),
    );
    expect(policy['style-src-attr']).toEqual(["'unsafe-inline'"]);
  });
  it('allows blob: workers and data: images, and nothing remote anywhere', () => {
    expect(policy['worker-src']).toContain('blob:');
    expect(policy['img-src']).toContain('data:');
    for (const [name, sources] of Object.entries(policy)) {
      for (const s of sources) expect(s, name).not.toMatch(/^(https?:|wss?:|\*|file:)/);
    }
    expect(policy['object-src']).toEqual(["'none'"]);
    expect(policy['base-uri']).toEqual(["'none'"]);
    expect(policy['frame-ancestors']).toEqual(["'none'"]);
  });
  it('is enough for plotly.js-dist-min: its only string evaluation sits in paths a current Chromium never takes', async () => {
    const plotly = await readFile(
      path.join(root, 'node_modules/plotly.js-dist-min/plotly.min.js'),
      'utf8',
    );
    const evals = [
      ...plotly.matchAll(/(?<![\w$.])(?:new\s+)?Function\(\s*["'a-zA-Z]|(?<![\w$])eval\(/g),
    ];
    const context = evals.map((m) => plotly.slice(Math.max(0, m.index - 120), m.index + 60));
    // 1: the global-object fallback after `typeof globalThis`; 2: the function-bind
    // polyfill (used only without Function.prototype.bind); 3: the map traces'
    // worker-script loader. If this count changes, re-read the new call sites
    // before keeping 'unsafe-eval' out of the policy.
    expect(context.length, context.join('\n---\n')).toBe(3);
    expect(
      context.some((c) => c.includes('typeof globalThis') && c.includes('Function("return this")')),
    ).toBe(true);
    expect(context.some((c) => c.includes('Function("binder"'))).toBe(true);
    expect(context.some((c) => c.includes('globalThis.eval('))).toBe(true);
  });
});

describe('app:// protocol instead of file:// (item 18 of the current list)', () => {
  const rendererDir = '/opt/plotrate/dist/renderer';
  const cases: [string, string | null][] = [
    ['app://plotrate/', '/opt/plotrate/dist/renderer/index.html'],
    [APP_ENTRY_URL, '/opt/plotrate/dist/renderer/index.html'],
    [
      'app://plotrate/assets/index-3f2a.js?v=1#x',
      '/opt/plotrate/dist/renderer/assets/index-3f2a.js',
    ],
    [
      'app://plotrate/assets/Hollow%20Creek.png',
      '/opt/plotrate/dist/renderer/assets/Hollow Creek.png',
    ],
    ['app://plotrate/../../etc/passwd', '/opt/plotrate/dist/renderer/etc/passwd'],
    ['app://plotrate/%2e%2e/%2e%2e/etc/passwd', '/opt/plotrate/dist/renderer/etc/passwd'],
    ['app://plotrate/..%2f..%2fetc%2fpasswd', null],
    ['app://plotrate/a%5c..%5c..%5cx', null],
    ['app://plotrate/a%00.js', null],
    ['app://other/index.html', null],
    ['file:///opt/plotrate/dist/renderer/index.html', null],
    ['https://plotrate/index.html', null],
    ['not a url', null],
  ];
  for (const [url, expected] of cases) {
    it(`maps ${url} to ${expected ?? 'nothing'}`, () => {
      expect(resolveAppRequest(url, rendererDir)).toBe(expected);
    });
  }
});

describe('navigation, new windows, webviews and permissions (items 5, 11, 12, 13, 14)', () => {
  class FakeContents extends EventEmitter {
    openHandler: ((details: { url: string }) => { action: string }) | null = null;
    setWindowOpenHandler(handler: (details: { url: string }) => { action: string }) {
      this.openHandler = handler;
    }
  }
  const navigate = (contents: FakeContents, eventName: string, url: string) => {
    let prevented = false;
    contents.emit(eventName, { url, preventDefault: () => (prevented = true) });
    return prevented;
  };

  it('blocks navigation and redirects to anything but the app’s own pages', () => {
    const contents = new FakeContents();
    guardWebContents(contents as unknown as WebContents);
    for (const eventName of ['will-navigate', 'will-frame-navigate', 'will-redirect']) {
      expect(navigate(contents, eventName, 'https://example.org/'), eventName).toBe(true);
      expect(navigate(contents, eventName, 'file:///etc/passwd'), eventName).toBe(true);
      expect(navigate(contents, eventName, 'app://plotrate.evil/'), eventName).toBe(true);
      expect(navigate(contents, eventName, 'app://plotrate/index.html'), eventName).toBe(false);
    }
  });

  it('denies every new window and every <webview>', () => {
    const contents = new FakeContents();
    guardWebContents(contents as unknown as WebContents);
    expect(contents.openHandler!({ url: 'https://example.org/' })).toEqual({ action: 'deny' });
    expect(contents.openHandler!({ url: 'app://plotrate/index.html' })).toEqual({ action: 'deny' });
    let prevented = false;
    const prefs: Record<string, unknown> = { preload: '/tmp/evil.js' };
    contents.emit('will-attach-webview', { preventDefault: () => (prevented = true) }, prefs, {
      src: 'https://x',
    });
    expect(prevented).toBe(true);
    expect(prefs.preload).toBeUndefined();
  });

  it('denies every permission request and check', () => {
    const handlers: Record<string, (...args: unknown[]) => unknown> = {};
    const session = {
      setPermissionRequestHandler: (h: never) => (handlers.request = h),
      setPermissionCheckHandler: (h: never) => (handlers.check = h),
      setDevicePermissionHandler: (h: never) => (handlers.device = h),
      setDisplayMediaRequestHandler: (h: never) => (handlers.display = h),
    };
    denyAllPermissions(session as unknown as Session);
    for (const permission of [
      'media',
      'geolocation',
      'notifications',
      'clipboard-read',
      'openExternal',
    ]) {
      let granted: unknown = 'not answered';
      handlers.request({}, permission, (ok: boolean) => (granted = ok));
      expect(granted, permission).toBe(false);
      expect(handlers.check({}, permission), permission).toBe(false);
    }
    expect(handlers.device({ deviceType: 'usb' })).toBe(false);
    let media: unknown;
    handlers.display({}, (streams: unknown) => (media = streams));
    expect(media).toEqual({});
  });

  it('lets only the page’s own blob: and data: downloads through', () => {
    expect(isAllowedDownload('blob:app://plotrate/4b1e-aa')).toBe(true);
    expect(isAllowedDownload('data:text/csv;base64,YQ==')).toBe(true);
    expect(isAllowedDownload('https://example.org/setup.exe')).toBe(false);
    expect(isAllowedDownload('blob:https://example.org/x')).toBe(false);
    expect(isAppUrl('app://plotrate/x')).toBe(true);
    expect(isAppUrl('app://plotrate.example/x')).toBe(false);
  });
});

describe('IPC sender check (item 17)', () => {
  it('accepts only the app page’s main frame', () => {
    expect(isAppSender({ url: 'app://plotrate/index.html', parent: null })).toBe(true);
    expect(isAppSender({ url: 'app://plotrate/index.html', parent: {} })).toBe(false);
    expect(isAppSender({ url: 'app://PLOTRATE/index.html', parent: null })).toBe(true);
    expect(isAppSender({ url: 'devtools://devtools/bundled/x.html', parent: null })).toBe(false);
    expect(isAppSender({ url: '', parent: null })).toBe(false);
    expect(isAppSender(null)).toBe(false);
  });
});

describe('the bundled preload (sandboxed: one file that requires only electron)', () => {
  let dir: string;
  let code: string;
  beforeAll(async () => {
    dir = await mkdtemp(path.join(os.tmpdir(), 'plotrate-preload-'));
    await build({
      entryPoints: [path.join(root, 'electron/preload.ts')],
      outfile: path.join(dir, 'preload.cjs'),
      bundle: true,
      platform: 'node',
      format: 'cjs',
      external: ['electron'],
      logLevel: 'silent',
    });
    code = await readFile(path.join(dir, 'preload.cjs'), 'utf8');
  });
  afterAll(async () => {
    await rm(dir, { recursive: true, force: true });
  });

  /** Run the bundle as Electron would, with electron's renderer modules recorded. */
  function runPreload() {
    const exposed: Record<string, unknown> = {};
    const invoked: unknown[][] = [];
    const listeners: Record<string, (...a: unknown[]) => void> = {};
    const windowListeners: Record<string, (e: unknown) => void> = {};
    const electron = {
      contextBridge: { exposeInMainWorld: (key: string, api: unknown) => (exposed[key] = api) },
      ipcRenderer: {
        invoke: (...args: unknown[]) => (invoked.push(args), Promise.resolve(null)),
        on: (channel: string, l: (...a: unknown[]) => void) => (listeners[channel] = l),
      },
      webUtils: { getPathForFile: () => '' },
    };
    const required: string[] = [];
    const sandbox = {
      require: (name: string) => (required.push(name), name === 'electron' ? electron : undefined),
      module: { exports: {} },
      exports: {},
      process: { argv: ['/opt/plotrate/plotrate', '--type=renderer', '--plotrate-version=0.1.0'] },
      window: {
        addEventListener: (name: string, l: (e: unknown) => void) => (windowListeners[name] = l),
      },
      document: { execCommand: () => true },
    };
    vm.runInNewContext(code, sandbox);
    return { exposed, invoked, listeners, required, windowListeners };
  }

  it('requires nothing but electron', () => {
    expect(runPreload().required).toEqual(['electron']);
    expect([...code.matchAll(/require\("([^"]+)"\)/g)].map((m) => m[1])).toEqual(['electron']);
  });

  it('exposes window.plotrate only, with the DesktopApi members and no ipcRenderer', () => {
    const { exposed } = runPreload();
    expect(Object.keys(exposed)).toEqual(['plotrate']);
    const api = exposed.plotrate as Record<string, unknown>;
    expect(Object.keys(api).sort()).toEqual(
      [
        'isDesktop',
        'appVersion',
        'openTrialFiles',
        'openProject',
        'openRecent',
        'saveProject',
        'exportFile',
        'printGrowerPage',
        'saveGrowerPdf',
        'recentFiles',
        'noteUnsavedChanges',
        'pendingRecovery',
        'discardRecovery',
        'onFilesOpened',
        'onMenuCommand',
        'reportError',
      ].sort(),
    );
    expect(api.appVersion).toBe('0.1.0');
    expect(Object.values(api).some((v) => v === undefined)).toBe(false);
    expect(JSON.stringify(Object.keys(api))).not.toMatch(/ipc|invoke|send/i);
  });

  it('turns each call into one invoke on its own channel', async () => {
    const { exposed, invoked } = runPreload();
    const api = exposed.plotrate as Record<string, (...a: unknown[]) => unknown>;
    await api.openRecent('0123456789abcdef0123');
    await api.exportFile('results.csv', new Uint8Array([1]), 'csv');
    expect(invoked).toEqual([
      [IPC.openRecent, '0123456789abcdef0123'],
      [IPC.exportFile, 'results.csv', new Uint8Array([1]), 'csv'],
    ]);
  });

  it('keeps files that arrive before the page subscribes, and drops unknown menu commands', () => {
    const { exposed, listeners } = runPreload();
    const api = exposed.plotrate as {
      onFilesOpened: (cb: (f: unknown) => void) => () => void;
      onMenuCommand: (cb: (c: string) => void) => () => void;
    };
    const early = { trialFiles: [], project: null, failures: [] };
    listeners[IPC_EVENTS.filesOpened]({}, early);
    const got: unknown[] = [];
    const off = api.onFilesOpened((f) => got.push(f));
    expect(got).toEqual([early]);
    off();
    listeners[IPC_EVENTS.filesOpened]({}, early);
    expect(got).toHaveLength(1);
    const commands: string[] = [];
    api.onMenuCommand((c) => commands.push(c));
    listeners[IPC_EVENTS.menuCommand]({}, 'rm -rf');
    listeners[IPC_EVENTS.menuCommand]({}, 'save');
    expect(commands).toEqual(['save']);
  });
});
