// Mounts the workspace on the page, given the analysis worker main.ts started.
import { mount } from 'svelte';
import App from './App.svelte';
import { chooseFileBridge } from './lib/fileBridge';
import { Workspace } from './state/workspace.svelte';
import { connectDesktop } from './state/desktop';

/** localStorage, or null where the browser refuses it (private modes, blocked storage). */
function storage(): Storage | null {
  try {
    return window.localStorage;
  } catch {
    return null;
  }
}

/**
 * Builds the workspace over the worker, mounts the app and starts it (restoring kept work or
 * opening the demo).
 * @param worker - the analysis worker
 */
export function startWindow(worker: Worker): void {
  const workspace = new Workspace(chooseFileBridge(), worker);
  // Started before the app is mounted: the demo's fetch (or the kept files' read) is under way
  // while the screens are built.
  void workspace.start(storage());
  mount(App, { target: document.getElementById('app')!, props: { workspace } });
  if (window.plotrate?.isDesktop) connectDesktop(workspace, window.plotrate);
}
