import type { BrowserWindowConstructorOptions } from 'electron';
import { VERSION_SWITCH } from './ipcChannels';

/**
 * The options of Plotrate's one window. Each security setting is written out
 * even where it is Electron's default, so a future default change or a
 * careless edit shows up in tests/shell.windowOptions.test.ts.
 *
 * @param preloadPath absolute path of the bundled preload (dist-electron/preload.cjs)
 * @param iconPath absolute path of the window icon (Linux and Windows use it)
 * @param appVersion Plotrate's version, handed to the sandboxed preload as a switch
 * @param developer whether this is a development run (not a packaged app): only then can the
 *   developer tools open, so a packaged build never offers a console into the page
 */
export function buildWindowOptions(
  preloadPath: string,
  iconPath: string,
  appVersion: string,
  developer: boolean,
): BrowserWindowConstructorOptions {
  return {
    width: 1280,
    height: 860,
    minWidth: 880,
    minHeight: 600,
    title: 'Plotrate',
    icon: iconPath,
    show: false,
    backgroundColor: '#f6f4ee',
    webPreferences: {
      preload: preloadPath,
      additionalArguments: [`${VERSION_SWITCH}${appVersion}`],
      contextIsolation: true,
      sandbox: true,
      nodeIntegration: false,
      nodeIntegrationInWorker: false,
      nodeIntegrationInSubFrames: false,
      webSecurity: true,
      allowRunningInsecureContent: false,
      experimentalFeatures: false,
      webviewTag: false,
      navigateOnDragDrop: false,
      safeDialogs: true,
      spellcheck: false,
      devTools: developer,
    },
  };
}
