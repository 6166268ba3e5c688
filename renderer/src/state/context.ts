// One context key for the workspace's shared state, so components read it
// without passing it through every level.
import { getContext, setContext } from 'svelte';
import type { Workspace } from './workspace.svelte';

const key = Symbol('plotrate.workspace');

/** Makes the workspace available to every component below the caller. */
export function provideWorkspace(workspace: Workspace): void {
  setContext(key, workspace);
}

/** The workspace provided by App. */
export function useWorkspace(): Workspace {
  const workspace = getContext<Workspace | undefined>(key);
  if (!workspace) throw new Error('useWorkspace() called outside <App>.');
  return workspace;
}
