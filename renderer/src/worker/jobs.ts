// The jobs the analysis worker runs, by name. Plain functions over shared/,
// so they are tested in node without a worker.
import type { TrialFileBytes } from '../../../shared/desktop/desktopContract';
import { isImportError } from '../../../shared/import/importError';
import type { RawWorkbook } from '../../../shared/import/rawWorkbook';
import { readTrialFile } from '../../../shared/import/readTrialFile';
import type { JobContext, JobHandler } from '../lib/workerProtocol';
import { analyzeTable, type AnalysisInput } from '../analysis/siteAnalysis';
import { regionalModelsOf, type TrialRegionalModels } from '../../../shared/analysis/analyzeTrial';
import type { TrialReport } from '../../../shared/report/trialReport';
import type { WorkbookOptions } from '../../../shared/report/workbook';

/** One file's outcome: its sheets, or the message to show where the user is looking. */
export type ReadOutcome =
  { name: string; ok: true; workbook: RawWorkbook } | { name: string; ok: false; message: string };

/**
 * Reads trial files into raw workbooks. A file that cannot be read becomes a
 * message naming it; the others still open.
 * @param files - names and bytes as the user gave them
 * @param ctx - progress and cancel
 * @returns one outcome per file, in the given order
 */
export async function readFiles(files: TrialFileBytes[], ctx: JobContext): Promise<ReadOutcome[]> {
  const out: ReadOutcome[] = [];
  for (const [i, file] of files.entries()) {
    await ctx.progress(i, files.length, file.name);
    try {
      out.push({ name: file.name, ok: true, workbook: await readTrialFile(file) });
    } catch (error) {
      const message = isImportError(error)
        ? error.message
        : `"${file.name}" could not be read (${error instanceof Error ? error.message : String(error)}).`;
      out.push({ name: file.name, ok: false, message });
    }
  }
  return out;
}

/**
 * The one analysis run (analyzeTrialSteps): fits and tests per site, the preview sent to the
 * window (ctx.partial), then, once the window has drawn it, the sites' bootstrap draws sent the
 * same way, then the rest of the across-site step, of which only the parts the preview left
 * pending are returned: the window completes the preview it holds (withDraws,
 * withRegionalModels), so a large trial's sites are cloned across once.
 * @param input - plot table and analysis settings
 * @param ctx - progress per site, and cancel
 * @returns the regional models, group comparisons and level mixed models (plain data)
 */
export async function analyze(input: AnalysisInput, ctx: JobContext): Promise<TrialRegionalModels> {
  const whole = await analyzeTable(
    input,
    (done, total, note) => ctx.progress(done, total, note),
    (partial) => ctx.partial(partial),
  );
  return regionalModelsOf(whole);
}

/**
 * Writes the report workbook.
 * @param input - the report and chart pictures
 * @param ctx - progress
 * @returns .xlsx bytes
 */
export async function workbook(
  input: { report: TrialReport; options: WorkbookOptions },
  ctx: JobContext,
): Promise<Uint8Array> {
  await ctx.progress(0, 1, 'writing the workbook');
  // The workbook writer (exceljs, most of this worker's code) is loaded on the first export, so
  // the worker starts reading and fitting without evaluating it.
  const { writeWorkbook } = await import('../../../shared/report/workbook');
  return writeWorkbook(input.report, input.options);
}

export const jobHandlers: Record<string, JobHandler> = {
  readFiles: readFiles as JobHandler,
  analyze: analyze as JobHandler,
  workbook: workbook as JobHandler,
};
