/**
 * The report workbook written through exceljs's streaming writer
 * (`stream.xlsx.WorkbookWriter`) into a stream the caller owns (the atomic
 * writer's temporary file), so a run of thousands of sites never holds the
 * whole workbook: each sheet is zipped and forgotten once complete.
 *
 * exceljs's streaming writer lacks three things the report's sheets use, added
 * here with exceljs's own parts so the file matches its in-memory writer:
 *   - pictures (the chart beside each site's data): each sheet's picture is
 *     written at once as its media part, with a drawing part and the
 *     relationships the in-memory writer makes (exceljs's Image, Anchor and
 *     DrawingXform lay it out, so the anchor is the same);
 *   - a sheet's views and page setup set after the sheet is made: the streaming
 *     writer writes the sheet's head (views, fit-to-page) the moment the sheet is
 *     created; here the head waits for the sheet's commit;
 *   - `views` as a settable property.
 * Tested against the in-memory writer cell by cell (tests/report.workbookStream.test.ts).
 */
import { createRequire } from 'node:module';
import type { Writable } from 'node:stream';
import type ExcelJS from 'exceljs';
import { fillWorkbook, type WorkbookOptions } from '../shared/report/workbook';
import type { TrialReport } from '../shared/report/trialReport';

// exceljs's internals, untyped: the streaming writer's classes and the xforms its
// in-memory writer uses for pictures. Pinned exceljs version in package.json.
/* eslint-disable @typescript-eslint/no-explicit-any */
const load = createRequire(import.meta.url);
const WorkbookWriter = load('exceljs/lib/stream/xlsx/workbook-writer.js') as any;
const WorksheetWriter = load('exceljs/lib/stream/xlsx/worksheet-writer.js') as any;
const Image = load('exceljs/lib/doc/image.js') as any;
const DrawingXform = load('exceljs/lib/xlsx/xform/drawing/drawing-xform.js') as any;
const RelationshipsXform = load('exceljs/lib/xlsx/xform/core/relationships-xform.js') as any;
const ContentTypesXform = load('exceljs/lib/xlsx/xform/core/content-types-xform.js') as any;
const RelType = load('exceljs/lib/xlsx/rel-type.js') as Record<string, string>;

const DRAWING_REL = 'http://schemas.openxmlformats.org/officeDocument/2006/relationships/drawing';

/** A sheet whose head waits for its commit and that may carry pictures. */
class PictureSheetWriter extends WorksheetWriter {
  pictures: { imageId: number; range: unknown }[] = [];

  constructor(options: Record<string, unknown>) {
    super(options);
  }

  // The streaming writer writes views and page properties when the sheet is made; the report
  // sets them last, so the head is written at commit, before the rows (which wait too).
  _writeOpenWorksheet(): void {}

  get views(): unknown[] {
    return this._views;
  }

  set views(value: unknown[]) {
    this._views = value;
  }

  addImage(imageId: number, range: unknown): void {
    // exceljs's Image turns the anchor given (fractional column and row) into the native
    // column, row and offsets with the sheet's column widths now, as the in-memory writer does.
    const model = new Image(this, { type: 'image', imageId, range }).model;
    this.pictures.push({ imageId, range: model.range });
  }

  commit(): void {
    if (this.committed) return;
    super._writeOpenWorksheet();
    super.commit();
  }

  // <drawing> comes right after the row breaks in a worksheet (ECMA-376 Part 1, 18.3.1.99).
  _writeRowBreaks(): void {
    super._writeRowBreaks();
    if (this.pictures.length === 0) return;
    const book = this._workbook as PictureWorkbookWriter;
    const name = `drawing${++book.drawingCount}`;
    const rels: { Id: string; Type: string; Target: string }[] = [];
    const anchors = this.pictures.map((p, i) => {
      rels.push({
        Id: `rId${i + 1}`,
        Type: RelType.Image,
        Target: `../media/${book.mediaName(p.imageId)}`,
      });
      return { picture: { rId: `rId${i + 1}` }, range: p.range };
    });
    const drawing = { anchors };
    const xform = new DrawingXform();
    xform.prepare(drawing, {});
    book.zip.append(xform.toXml(drawing), { name: `xl/drawings/${name}.xml` });
    book.zip.append(new RelationshipsXform().toXml(rels), {
      name: `xl/drawings/_rels/${name}.xml.rels`,
    });
    book.drawings.push({ name });
    const rId = this._sheetRelsWriter.addRelationship({
      Type: DRAWING_REL,
      Target: `../drawings/${name}.xml`,
    });
    this.stream.write(`<drawing r:id="${rId}"/>`);
    this.pictures = [];
  }
}

/**
 * Gives exceljs's style table one lookup per distinct style instead of one per cell. Every cell
 * carries its own style object, so exceljs's own cache (by object) never hits and each cell's
 * font, fill, border and format were written out as XML to be matched (1.8 of 4 s writing 1,000
 * site sheets, measured here). The id depends only on the style and the cell type, so a style
 * seen before takes the id exceljs gave it then.
 */
function internStyles(styles: {
  addStyleModel: (model: unknown, cellType?: number) => number;
}): void {
  const add = styles.addStyleModel.bind(styles);
  const ids = new Map<string, number>();
  styles.addStyleModel = (model, cellType) => {
    if (!model) return add(model, cellType);
    const key = `${cellType ?? ''}|${JSON.stringify(model)}`;
    let id = ids.get(key);
    if (id === undefined) {
      id = add(model, cellType);
      ids.set(key, id);
    }
    return id;
  };
}

/** exceljs's streaming workbook writer with PictureSheetWriter sheets and pictures zipped at once. */
class PictureWorkbookWriter extends WorkbookWriter {
  drawingCount = 0;
  drawings: { name: string }[] = [];
  /** Parts the zip has finished, each with whoever waits for it. */
  private waiting = new Map<string, () => void>();

  constructor(options: Record<string, unknown>) {
    super(options);
    internStyles(this.styles);
    this.zip.on('entry', (entry: { name: string }) => {
      this.waiting.get(entry.name)?.();
      this.waiting.delete(entry.name);
    });
  }

  /**
   * Resolves when the zip has deflated and written a sheet (archiver's 'entry' event; the zip
   * itself waits for the file when the disk is slower). Building sheets never yields otherwise,
   * so without this wait every sheet would sit in memory, unzipped, until the last.
   */
  sheetZipped(sheet: PictureSheetWriter): Promise<void> {
    return new Promise((resolve) => {
      this.waiting.set(`xl/worksheets/sheet${sheet.id}.xml`, resolve);
    });
  }

  /** The media part's name as the in-memory writer names it (image1.png for the first). */
  mediaName(imageId: number): string {
    return `image${imageId + 1}.${this.media[imageId].extension}`;
  }

  // The streaming writer keeps every picture until the end; here each goes into the zip at
  // once and only its name and extension are kept (for the content types).
  addImage(image: { buffer: Uint8Array; extension: string }): number {
    const id = this.media.length;
    this.media.push({ type: 'image', extension: image.extension, name: `image${id + 1}` });
    this.zip.append(Buffer.from(image.buffer), { name: `xl/media/${this.mediaName(id)}` });
    return id;
  }

  addMedia(): Promise<void> {
    return Promise.resolve();
  }

  addWorksheet(name: string): PictureSheetWriter {
    const id = this.nextId;
    const sheet = new PictureSheetWriter({
      id,
      name: name || `sheet${id}`,
      workbook: this,
      useSharedStrings: this.useSharedStrings,
    });
    this._worksheets[id] = sheet;
    return sheet;
  }

  // The streaming writer's content types leave out drawings.
  addContentTypes(): Promise<void> {
    const xml = new ContentTypesXform().toXml({
      worksheets: this._worksheets.filter(Boolean),
      sharedStrings: this.sharedStrings,
      commentRefs: this.commentRefs,
      media: this.media,
      drawings: this.drawings,
    });
    this.zip.append(xml, { name: '[Content_Types].xml' });
    return Promise.resolve();
  }
}
/* eslint-enable @typescript-eslint/no-explicit-any */

/**
 * Writes the report workbook into a stream, a sheet at a time: each sheet is committed and
 * zipped before the next is made, so memory holds one sheet and the zip's window.
 * @param out - where the .xlsx bytes go (the caller's temporary file); ended when done
 * @param report - the assembled analysis
 * @param options - chart pictures and deflate level (1–9; zlib's default when omitted)
 * @param afterSheet - called with the number of sheets written after each one is in the zip
 * @returns when the last byte is handed to `out` and `out` has finished
 * @example
 * await streamWorkbook(createWriteStream('report.xlsx'), report, { zipLevel: 1 });
 */
export async function streamWorkbook(
  out: Writable,
  report: TrialReport,
  options: WorkbookOptions = {},
  afterSheet: (written: number) => void = () => undefined,
): Promise<void> {
  const wb = new PictureWorkbookWriter({
    stream: out,
    useStyles: true,
    useSharedStrings: false,
    zip: options.zipLevel === undefined ? undefined : { zlib: { level: options.zipLevel } },
  });
  let written = 0;
  await fillWorkbook(wb as unknown as ExcelJS.Workbook, report, options, async (sheet) => {
    const s = sheet as unknown as PictureSheetWriter;
    const zipped = wb.sheetZipped(s);
    s.commit();
    await zipped;
    afterSheet(++written);
  });
  await wb.commit();
}
