// The workspace's state classes under Node: a real job server on a MessageChannel serving the
// same handlers the worker serves, and a file bridge that only remembers names. No browser.
import { afterEach } from 'vitest';
import type { FileBridge } from '../../renderer/src/lib/fileBridge';
import { serveJobs, type Port } from '../../renderer/src/lib/workerProtocol';
import { Workspace } from '../../renderer/src/state/workspace.svelte';
import { jobHandlers } from '../../renderer/src/worker/jobs';

const channels: MessageChannel[] = [];

/**
 * A workspace whose jobs run in this process; the channels close after each test.
 * @returns a fresh Workspace
 */
export function nodeWorkspace(): Workspace {
  const channel = new MessageChannel();
  channels.push(channel);
  serveJobs(channel.port2 as unknown as Port, jobHandlers);
  channel.port1.start();
  channel.port2.start();
  const bridge: FileBridge = {
    isDesktop: false,
    openTrialFiles: async () => [],
    exportFile: async (name) => name,
    print: async () => {},
    savePdf: async () => null,
  };
  return new Workspace(bridge, channel.port1 as unknown as Port);
}

afterEach(() => {
  for (const c of channels.splice(0)) {
    c.port1.close();
    c.port2.close();
  }
});
