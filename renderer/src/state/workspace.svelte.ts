// The analyst's workspace: everything the screens share, passed by context.
import type { TrialFileBytes } from '../../../electron/desktopApi';
import { fetchDemoFile } from '../lib/demoFile';
import type { FileBridge } from '../lib/fileBridge';
import type { Port } from '../lib/workerProtocol';
import { Jobs } from './jobs.svelte';
import { Messages } from './messages.svelte';
import { Settings } from './settings.svelte';
import { Sources } from './sources.svelte';
import type { StepId } from './steps';

export class Workspace {
  step = $state<StepId>('files');
  readonly settings = new Settings();
  readonly messages = new Messages();
  readonly jobs: Jobs;
  readonly sources: Sources;
  readonly bridge: FileBridge;

  constructor(bridge: FileBridge, workerPort: Port) {
    this.bridge = bridge;
    this.jobs = new Jobs(workerPort);
    this.sources = new Sources(this.jobs, this.messages);
  }

  /** Opens trial files and moves on to the column review when one was readable. */
  async openFiles(files: TrialFileBytes[]): Promise<void> {
    await this.sources.add(files);
  }

  /** Opens the invented demo trial shipped with the app. */
  async openDemo(): Promise<void> {
    try {
      await this.openFiles([await fetchDemoFile()]);
    } catch (error) {
      this.messages.add(
        'error',
        'The demo trial could not be opened',
        error instanceof Error ? error.message : String(error),
      );
    }
  }
}
