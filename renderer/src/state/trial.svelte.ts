// The trial as the user shaped it: mappings, import settings, plot decisions
// (all undoable), and the plot table and findings that follow from them.
import type { ColumnMapping } from '../../../shared/import/columnMapping';
import { detectColumns } from '../../../shared/import/detectColumns';
import { reuseMapping } from '../../../shared/import/reuseMapping';
import { buildPlotTable } from '../../../shared/import/buildPlotTable';
import { isImportError } from '../../../shared/import/importError';
import type { RawWorkbook } from '../../../shared/import/rawWorkbook';
import { checkQuality } from '../../../shared/quality/checkQuality';
import type { QualityFinding } from '../../../shared/table/qualityFinding';
import type { CropId, PlotTable } from '../../../shared/table/plotTable';
import { cropsNamed, type CropNamed } from '../../../shared/import/cropsNamed';
import { crops } from '../../../shared/units/crops';
import { applyDecisions, setHeaderRow, type Edits } from '../analysis/edits';
import { History } from './history.svelte';
import type { Sources } from './sources.svelte';

/** The plot table built from the files, or the message saying why it could not be. */
export type Built =
  { ok: true; table: PlotTable; findings: QualityFinding[] } | { ok: false; message: string };

export const DEFAULT_EDITS: Edits = {
  mappings: {},
  settings: { crop: 'corn', rateBasis: 'nutrient' },
  decisions: {},
};

export class Trial {
  edits = $state.raw<Edits>(DEFAULT_EDITS);
  /** The table of an opened project, used while its spreadsheets are not open. */
  projectTable = $state.raw<PlotTable | null>(null);
  readonly #history: History;
  readonly #sources: Sources;

  /**
   * @param sources - the open files
   * @param history - the workspace's undo history, which this trial's changes go to
   */
  constructor(sources: Sources, history: History = new History()) {
    this.#sources = sources;
    this.#history = history;
  }

  /** What Undo would take back, or null (the workspace's history, prices included). */
  get undoLabel(): string | null {
    return this.#history.undoLabel;
  }

  get redoLabel(): string | null {
    return this.#history.redoLabel;
  }

  /** Workbooks that have a mapping, with their mappings, in file order. */
  #mapped = $derived.by(() => {
    const books: RawWorkbook[] = [];
    const maps: ColumnMapping[] = [];
    for (const book of this.#sources.workbooks) {
      const mapping = this.edits.mappings[book.file.name];
      if (mapping) {
        books.push(book);
        maps.push(mapping);
      }
    }
    return { books, maps };
  });

  /**
   * The crops the mapped plots sheets name (sheet name, title row, crop column or file name), with
   * how many sheets name each, most first. One crop is analysed at a time (buildPlotTable leaves
   * the others' sheets out), so with more than one the workspace offers the choice.
   */
  namedCrops: CropNamed[] = $derived(
    cropsNamed(
      this.#mapped.books.map((b, i) => ({ name: b.file.name, mapping: this.#mapped.maps[i] })),
    ),
  );

  /**
   * True when plots sheets are mapped, none names its crop and the user has not said which it is:
   * the crop is then only the default, and the workspace asks rather than guessing in silence.
   */
  cropUnknown: boolean = $derived(
    !this.edits.settings.cropConfirmed &&
      this.#mapped.maps.some((m) => m.sheets.some((s) => s.use === 'plots')) &&
      this.#mapped.maps.every((m) => m.sheets.every((s) => s.use !== 'plots' || !s.cropHint)),
  );

  built: Built | null = $derived.by(() => {
    const { books, maps } = this.#mapped;
    if (books.length === 0) {
      return this.projectTable ? { ok: true, table: this.projectTable, findings: [] } : null;
    }
    try {
      return { ok: true, ...buildPlotTable(books, maps, this.edits.settings) };
    } catch (error) {
      const message =
        isImportError(error) || error instanceof Error ? error.message : String(error);
      return { ok: false, message };
    }
  });

  /** The plot table with the user's decisions applied; null before any file is read. */
  table: PlotTable | null = $derived(
    this.built?.ok
      ? applyDecisions(this.built.table, this.edits.decisions, this.edits.corrections)
      : null,
  );

  /**
   * Findings from reading the cells and from the data checks. The checks run on
   * the table as built (before the user's decisions), so a finding stays listed
   * with the decision taken on it.
   */
  findings: QualityFinding[] = $derived.by(() => {
    const built = this.built;
    if (!built?.ok) return [];
    try {
      return [...built.findings, ...checkQuality(built.table)];
    } catch (error) {
      return [
        ...built.findings,
        {
          code: 'model-not-fitted',
          severity: 'warning',
          message: `The data checks could not run: ${error instanceof Error ? error.message : String(error)}`,
          refs: [],
        },
      ];
    }
  });

  /**
   * Detects the columns of workbooks that have no mapping yet (not an undoable
   * step). A file opened again under the same name keeps the user's column
   * choices when its layout is the same (reuseMapping), else is detected afresh.
   * @param reopened - names of files just read again
   */
  detectNew(reopened: readonly string[] = []): void {
    const books = this.#sources.workbooks.filter(
      (b) => !this.edits.mappings[b.file.name] || reopened.includes(b.file.name),
    );
    if (books.length === 0) return;
    const first = Object.keys(this.edits.mappings).length === 0;
    const mappings = { ...this.edits.mappings };
    for (const book of books) {
      const saved = mappings[book.file.name];
      mappings[book.file.name] = saved ? reuseMapping(book, saved).mapping : detectColumns(book);
    }
    // The first files set the crop the way the command line does (the crop most of their sheets
    // name), unless the user has said it; later files never switch it (the picker does).
    const named =
      first && !this.edits.settings.cropConfirmed
        ? cropsNamed(books.map((b) => ({ name: b.file.name, mapping: mappings[b.file.name] })))
        : [];
    const settings =
      named.length > 0 && named[0].crop !== this.edits.settings.crop
        ? { ...this.edits.settings, crop: named[0].crop, standardMoisturePct: undefined }
        : this.edits.settings;
    this.edits = { ...this.edits, mappings, settings };
  }

  /**
   * Sets the crop (undoable); the standard moisture follows the crop's unless the user sets one.
   * @param crop - the crop the plots are
   */
  setCrop(crop: CropId): void {
    this.change(`Crop: ${crops(crop).label}`, {
      ...this.edits,
      settings: {
        ...this.edits.settings,
        crop,
        cropConfirmed: true,
        standardMoisturePct: undefined,
      },
    });
  }

  /**
   * Reads a sheet's headers from the row the user chose (undoable).
   * @param file - the file's name
   * @param sheet - the sheet's name
   * @param headerRow - the 1-based header row
   */
  setHeaderRow(file: string, sheet: string, headerRow: number): void {
    const raw = this.#sources.workbooks.find((b) => b.file.name === file);
    const mapping = this.edits.mappings[file];
    if (!raw || !mapping) return;
    this.change(`Sheet ${sheet || file}: header in row ${headerRow}`, {
      ...this.edits,
      mappings: { ...this.edits.mappings, [file]: setHeaderRow(mapping, raw, sheet, headerRow) },
    });
  }

  /** Makes an undoable change. */
  change(label: string, next: Edits): void {
    const before = this.edits;
    this.edits = next;
    this.#history.record(label, {
      before: () => (this.edits = before),
      after: () => (this.edits = next),
    });
  }

  undo(): void {
    this.#history.undo();
  }

  redo(): void {
    this.#history.redo();
  }

  /** Replaces the edits wholesale (a restored session); forgets the undo history. */
  restore(edits: Edits): void {
    this.edits = edits;
    this.#history.clear();
  }
}
