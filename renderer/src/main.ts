import { mount } from 'svelte';
import './app.css';
import App from './App.svelte';
import { chooseFileBridge } from './lib/fileBridge';
import { Workspace } from './state/workspace.svelte';
import { connectDesktop } from './state/desktop';

// One worker for all heavy analysis; Vite bundles it as its own module.
const worker = new Worker(new URL('./worker/analysis.worker.ts', import.meta.url), {
  type: 'module',
});
/** localStorage, or null where the browser refuses it (private modes, blocked storage). */
function storage(): Storage | null {
  try {
    return window.localStorage;
  } catch {
    return null;
  }
}

const workspace = new Workspace(chooseFileBridge(), worker);

mount(App, { target: document.getElementById('app')!, props: { workspace } });
void workspace.start(storage());
if (window.plotrate?.isDesktop) connectDesktop(workspace, window.plotrate);
