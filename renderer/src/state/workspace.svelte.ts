// The analyst's workspace: everything the screens share, passed by context.
import { EMPTY_PAGE_FIELDS } from '../../../shared/report/pageFields';
import type { TrialFileBytes } from '../../../shared/desktop/desktopContract';
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
import { isStepId, type StepId } from './steps';
import { checkSession, type Session } from '../lib/session';
import {
  base64ToBytes,
  bytesToBase64,
  loadSession,
  saveSession,
  type KeyValueStore,
} from '../lib/persistence';
import { Trial } from './trial.svelte';
import { inputUnitsOf } from '../../../shared/import/inputUnits';
import { History } from './history.svelte';

export class Workspace {
  step = $state<StepId>('files');
  /** False until start-up has restored or opened something (nothing is kept before that). */
  ready = $state(false);
  readonly settings = new Settings();
  readonly messages = new Messages();
  /** One undo history for the trial's edits and the prices. */
  readonly history = new History();
  readonly prices = new Prices(() => this.crop, this.history);
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
    this.trial = new Trial(this.sources, this.history);
    this.analysis = new Analysis(this.jobs, this.messages, this.prices);
    this.report = new Report(this);
  }

  /** The crop of the current table (the import setting until a table exists). */
  get crop() {
    return this.trial.table?.crop ?? this.trial.edits.settings.crop;
  }

  /**
   * Start-up: restores the work this browser kept; the first time (or when the
   * kept record cannot be read, which is said) opens the demo trial.
   * @param store - localStorage, or null where there is none
   */
  async start(store: KeyValueStore | null): Promise<void> {
    try {
      await this.#startFrom(store);
    } finally {
      this.ready = true;
    }
  }

  async #startFrom(store: KeyValueStore | null): Promise<void> {
    const loaded = store ? loadSession(store, checkSession) : { kind: 'empty' as const };
    if (loaded.kind === 'loaded') {
      await this.restore(loaded.session);
      if (this.sources.files.length > 0) return;
    }
    if (loaded.kind === 'unreadable') {
      this.messages.add('warning', 'Your earlier work could not be restored', loaded.message);
    }
    await this.openDemo();
  }

  /** The session as it stands, for localStorage. */
  session(): Session {
    return {
      version: 1,
      files: this.sources.files.map((f) => ({ name: f.name, base64: bytesToBase64(f.bytes) })),
      edits: this.trial.edits,
      prices: this.prices.settings,
      unitSystem: this.settings.unitSystem,
      locale: this.settings.locale,
      choices: this.analysis.choices,
      blocks: this.analysis.blocks,
      step: this.step,
      selectedSite: this.analysis.selectedSite,
      shortfallTolerancePerHa: this.prices.shortfallTolerancePerHa,
      pageFields: { ...this.report.fields },
    };
  }

  /** Brings a saved session back: files are read again, then the edits laid over them. */
  async restore(session: Session): Promise<void> {
    this.settings.unitSystem = session.unitSystem;
    this.settings.locale = session.locale;
    this.prices.settings = session.prices;
    this.prices.shortfallTolerancePerHa = session.shortfallTolerancePerHa ?? null;
    this.report.fields = { ...(session.pageFields ?? EMPTY_PAGE_FIELDS) };
    this.analysis.choices = session.choices;
    this.analysis.blocks = session.blocks;
    this.analysis.selectedSite = session.selectedSite;
    this.trial.restore(session.edits);
    const files = session.files.map((f) => ({ name: f.name, bytes: base64ToBytes(f.base64) }));
    if (files.length > 0) await this.sources.add(files);
    this.trial.detectNew();
    if (isStepId(session.step)) this.step = session.step;
  }

  #storageWarned = false;

  /** Writes the session to the store; a refusal (full quota) is said once. */
  persist(store: KeyValueStore): void {
    const problem = saveSession(store, this.session());
    if (problem && !this.#storageWarned) {
      this.#storageWarned = true;
      this.messages.add('warning', 'This browser is not keeping your work', problem);
    }
  }

  /**
   * Opens trial files, detects their columns and shows the column review.
   * @param files - names and bytes
   * @param options - `unitsFromFiles`: the first files set the workspace's units (default true);
   *   `review`: go to the column review (default true; the demo opens on its first site instead,
   *   and drawing the review it would leave at once cost the first analysis about 80 ms)
   */
  async openFiles(
    files: TrialFileBytes[],
    options: { unitsFromFiles?: boolean; review?: boolean } = {},
  ): Promise<void> {
    const before = this.sources.workbooks.length;
    const stepBefore = this.step;
    const reopened = files.map((f) => f.name).filter((n) => this.trial.edits.mappings[n]);
    await this.sources.add(files);
    this.trial.detectNew(reopened);
    for (const file of files) {
      const mapping = this.trial.edits.mappings[file.name];
      if (mapping && !mapping.sheets.some((s) => s.use === 'plots')) {
        this.messages.add(
          'warning',
          `No plot data found in ${file.name}`,
          `No sheet of “${file.name}” has a header row with a yield column near its top, so it adds no plots. ` +
            'If it does hold plots, give the row that holds its headers (“Header in row”) in the Columns step, then each column its role.',
        );
      }
    }
    // The first files of a workspace set its units: a file of lb/ac and bu/ac opens in US units.
    if (before === 0 && (options.unitsFromFiles ?? true)) {
      const mappings = files.map((f) => this.trial.edits.mappings[f.name]).filter((m) => !!m);
      if (mappings.length > 0)
        this.settings.unitSystem = inputUnitsOf(mappings).rate === 'lb/ac' ? 'us' : 'metric';
    }
    // Show the column review, unless the user went elsewhere while the files were read.
    if (this.sources.workbooks.length > before && this.step === stepBefore)
      this.step = (options.review ?? true) ? 'columns' : 'site';
  }

  /** Opens the invented demo trial shipped with the app and shows its first site. */
  async openDemo(): Promise<void> {
    try {
      // The demo is shown in metric units, whatever its sheets use, until the user switches.
      await this.openFiles([await fetchDemoFile()], { unitsFromFiles: false, review: false });
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
