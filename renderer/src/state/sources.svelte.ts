// The trial files the user opened: bytes as given, and each file's sheets once read.
import type { TrialFileBytes } from '../../../shared/desktop/desktopContract';
import type { RawWorkbook } from '../../../shared/import/rawWorkbook';
import type { ReadOutcome } from '../worker/jobs';
import type { Jobs } from './jobs.svelte';
import type { Messages } from './messages.svelte';

export class Sources {
  /** The files as given, bytes untouched (nothing the user gave is lost). */
  files = $state.raw<TrialFileBytes[]>([]);
  /** Each readable file's sheets, in the order of `files`. */
  workbooks = $state.raw<RawWorkbook[]>([]);
  /** Files that could not be read: name → the message shown beside it. */
  failures = $state.raw<Record<string, string>>({});
  readonly #jobs: Jobs;
  readonly #messages: Messages;

  constructor(jobs: Jobs, messages: Messages) {
    this.#jobs = jobs;
    this.#messages = messages;
  }

  /**
   * Adds files (a file of the same name replaces the older copy) and reads
   * them in the worker. Unreadable files stay listed with their message.
   */
  async add(files: TrialFileBytes[]): Promise<void> {
    const names = files.map((f) => f.name);
    const outcomes = await this.#jobs.run<ReadOutcome[]>('Reading files', 'readFiles', files);
    if (!outcomes) return;
    this.files = [...this.files.filter((f) => !names.includes(f.name)), ...files];
    const failures = { ...this.failures };
    const kept = this.workbooks.filter((w) => !names.includes(w.file.name));
    for (const outcome of outcomes) {
      delete failures[outcome.name];
      if (outcome.ok) kept.push(outcome.workbook);
      else {
        failures[outcome.name] = outcome.message;
        this.#messages.add('error', `${outcome.name} could not be opened`, outcome.message);
      }
    }
    this.failures = failures;
    this.workbooks = this.files
      .map((f) => kept.find((w) => w.file.name === f.name))
      .filter((w): w is RawWorkbook => w !== undefined);
  }

  /** Closes one file (its plots leave the analysis). */
  remove(name: string): void {
    this.files = this.files.filter((f) => f.name !== name);
    this.workbooks = this.workbooks.filter((w) => w.file.name !== name);
    const failures = { ...this.failures };
    delete failures[name];
    this.failures = failures;
  }
}
