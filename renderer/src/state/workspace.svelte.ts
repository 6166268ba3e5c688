// The analyst's workspace: everything the screens share, passed by context.
import type { TrialFileBytes } from '../../../electron/desktopApi';
import type { FileBridge } from '../lib/fileBridge';
import type { Port } from '../lib/workerProtocol';
import { Jobs } from './jobs.svelte';
import { Messages } from './messages.svelte';
import { Settings } from './settings.svelte';
import type { StepId } from './steps';

export class Workspace {
  step = $state<StepId>('files');
  /** The trial files as given, bytes untouched (nothing the user gave is lost). */
  files = $state.raw<TrialFileBytes[]>([]);
  readonly settings = new Settings();
  readonly messages = new Messages();
  readonly jobs: Jobs;
  readonly bridge: FileBridge;

  constructor(bridge: FileBridge, workerPort: Port) {
    this.bridge = bridge;
    this.jobs = new Jobs(workerPort);
  }

  /** Adds trial files; a file of the same name replaces the older copy. */
  async addFiles(files: TrialFileBytes[]): Promise<void> {
    const names = files.map((f) => f.name);
    this.files = [...this.files.filter((f) => !names.includes(f.name)), ...files];
  }

  /** Closes one file (its plots leave the analysis). */
  removeFile(name: string): void {
    this.files = this.files.filter((f) => f.name !== name);
  }

  /** Opens the invented demo trial. */
  async openDemo(): Promise<void> {
    this.messages.add('info', 'The demo trial arrives with the import module.');
  }
}
