// The analyst's workspace: everything the screens share, passed by context.
import type { TrialFileBytes } from '../../../electron/desktopApi';
import { fetchDemoFile } from '../lib/demoFile';
import type { FileBridge } from '../lib/fileBridge';
import type { Port } from '../lib/workerProtocol';
import { Analysis } from './analysis.svelte';
import { Jobs } from './jobs.svelte';
import { Messages } from './messages.svelte';
import { Prices } from './prices.svelte';
import { Report } from './report.svelte';
import { Settings } from './settings.svelte';
import { Sources } from './sources.svelte';
import type { StepId } from './steps';
import { Trial } from './trial.svelte';

export class Workspace {
  step = $state<StepId>('files');
  readonly settings = new Settings();
  readonly messages = new Messages();
  readonly prices = new Prices();
  readonly jobs: Jobs;
  readonly sources: Sources;
  readonly trial: Trial;
  readonly analysis: Analysis;
  readonly report: Report;
  readonly bridge: FileBridge;
  /** Drawn chart elements by key, for Plotly.toImage at export (not reactive: only read on export). */
  readonly charts: Record<string, HTMLElement> = {};

  constructor(bridge: FileBridge, workerPort: Port) {
    this.bridge = bridge;
    this.jobs = new Jobs(workerPort);
    this.sources = new Sources(this.jobs, this.messages);
    this.trial = new Trial(this.sources);
    this.analysis = new Analysis(this.jobs, this.messages, this.prices);
    this.report = new Report(this);
  }

  /** The crop of the current table (the import setting until a table exists). */
  get crop() {
    return this.trial.table?.crop ?? this.trial.edits.settings.crop;
  }

  /** First start: opens the demo trial so a new user sees an analysis at once. */
  async start(): Promise<void> {
    if (this.sources.files.length === 0) await this.openDemo();
  }

  /** Opens trial files, detects their columns and shows the column review. */
  async openFiles(files: TrialFileBytes[]): Promise<void> {
    const before = this.sources.workbooks.length;
    await this.sources.add(files);
    this.trial.detectNew();
    if (this.sources.workbooks.length > before) this.step = 'columns';
  }

  /** Opens the invented demo trial shipped with the app and shows its first site. */
  async openDemo(): Promise<void> {
    try {
      await this.openFiles([await fetchDemoFile()]);
      this.step = 'site';
    } catch (error) {
      this.messages.add(
        'error',
        'The demo trial could not be opened',
        error instanceof Error ? error.message : String(error),
      );
    }
  }
}
