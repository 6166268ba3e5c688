/**
 * Checks for the arguments of every IPC call. The page is treated as
 * untrusted: a value of the wrong shape is refused with IpcArgumentError
 * naming the call and argument, before any dialog opens or file is touched.
 */
import path from 'node:path';
import { ProjectFileError } from '../shared/project/projectFileError';
import { parseProject } from '../shared/project/parseProject';
import type { PlotrateProject } from '../shared/project/projectFormat';
import { serializeProject } from '../shared/project/serializeProject';
import type { ErrorReport, ExportKind } from '../shared/desktop/desktopContract';
import { IpcArgumentError } from './shellErrors';

/** The export kinds and their save-dialog filters. */
export const EXPORT_KINDS: Record<ExportKind, { label: string; extensions: string[] }> = {
  xlsx: { label: 'Excel workbook', extensions: ['xlsx'] },
  csv: { label: 'CSV table', extensions: ['csv'] },
  pdf: { label: 'PDF document', extensions: ['pdf'] },
  json: { label: 'JSON data', extensions: ['json'] },
  png: { label: 'PNG image', extensions: ['png'] },
  svg: { label: 'SVG image', extensions: ['svg'] },
};

/** Largest export the shell writes, bytes. */
export const MAX_EXPORT_BYTES = 256 * 1024 * 1024;

/** Require exactly n arguments (extra ones hint at a caller out of step with this shell). */
export function expectCount(channel: string, args: readonly unknown[], n: number): void {
  if (args.length !== n)
    throw new IpcArgumentError(channel, 'list', `should have ${n} value(s), got ${args.length}`);
}

/** A short file name: no folders, no control characters, not empty, ≤ 200 characters. */
export function checkFileName(channel: string, argument: string, value: unknown): string {
  if (typeof value !== 'string')
    throw new IpcArgumentError(channel, argument, `should be text, got ${typeof value}`);
  if (value.trim() === '' || value.length > 200)
    throw new IpcArgumentError(channel, argument, 'should be a file name of 1 to 200 characters');
  if (
    [...value].some((c) => c.charCodeAt(0) < 0x20) ||
    value !== path.basename(value) ||
    /[\\/]/.test(value) ||
    value === '..' ||
    value === '.'
  )
    throw new IpcArgumentError(
      channel,
      argument,
      `should be a bare file name without folders, got "${value}"`,
    );
  return value;
}

/** Bytes to write: a Uint8Array no larger than MAX_EXPORT_BYTES. */
export function checkBytes(channel: string, argument: string, value: unknown): Uint8Array {
  if (!(value instanceof Uint8Array))
    throw new IpcArgumentError(channel, argument, 'should be bytes (a Uint8Array)');
  if (value.byteLength > MAX_EXPORT_BYTES)
    throw new IpcArgumentError(
      channel,
      argument,
      `is ${value.byteLength} bytes, above the ${MAX_EXPORT_BYTES} limit`,
    );
  return value;
}

export function checkExportKind(channel: string, value: unknown): ExportKind {
  if (typeof value !== 'string' || !Object.prototype.hasOwnProperty.call(EXPORT_KINDS, value))
    throw new IpcArgumentError(
      channel,
      'kind',
      `should be one of ${Object.keys(EXPORT_KINDS).join(', ')}, got ${JSON.stringify(value)}`,
    );
  return value as ExportKind;
}

export function checkSaveOptions(channel: string, value: unknown): { saveAs: boolean } {
  if (
    typeof value !== 'object' ||
    value === null ||
    typeof (value as { saveAs?: unknown }).saveAs !== 'boolean'
  )
    throw new IpcArgumentError(channel, 'options', 'should be { saveAs: true | false }');
  return { saveAs: (value as { saveAs: boolean }).saveAs };
}

/**
 * A project from the page, checked exactly as a file would be: serialized and
 * read back with the project parser, so the page cannot save what could not
 * be opened again.
 */
export function checkProject(channel: string, value: unknown): PlotrateProject {
  if (typeof value !== 'object' || value === null)
    throw new IpcArgumentError(channel, 'project', 'should be a project object');
  const project = value as PlotrateProject;
  let text: string;
  try {
    text = serializeProject(project, new Date(Date.parse(project.savedAt) || 0));
  } catch (e) {
    throw new IpcArgumentError(
      channel,
      'project',
      `cannot be written as JSON (${(e as Error).message})`,
    );
  }
  try {
    const parsed = parseProject(text, 'project');
    if (parsed.migratedFrom !== null)
      throw new IpcArgumentError(channel, 'project', 'should be in the current format version');
    return parsed.project;
  } catch (e) {
    if (e instanceof ProjectFileError)
      throw new IpcArgumentError(
        channel,
        'project',
        `is not a valid project: ${e.field ? `${e.field}: ` : ''}${e.detail}`,
      );
    throw e;
  }
}

export function checkRecentId(channel: string, value: unknown): string {
  if (typeof value !== 'string' || !/^[0-9a-f]{20}$/.test(value))
    throw new IpcArgumentError(channel, 'id', 'should be an id from recentFiles()');
  return value;
}

export function checkErrorReport(channel: string, value: unknown): ErrorReport {
  const r = value as Partial<ErrorReport> | null;
  if (
    typeof r !== 'object' ||
    r === null ||
    typeof r.message !== 'string' ||
    typeof r.where !== 'string'
  )
    throw new IpcArgumentError(
      channel,
      'report',
      'should be { message: text, where: text, stack?: text }',
    );
  if (r.stack !== undefined && typeof r.stack !== 'string')
    throw new IpcArgumentError(channel, 'report.stack', 'should be text when given');
  return {
    message: r.message.slice(0, 4000),
    where: r.where.slice(0, 200),
    ...(r.stack ? { stack: r.stack.slice(0, 16000) } : {}),
  };
}

/** Paths the preload read from dropped File objects: absolute, at most 50. */
export function checkDroppedPaths(channel: string, value: unknown): string[] {
  if (!Array.isArray(value) || value.length > 50)
    throw new IpcArgumentError(channel, 'paths', 'should be a list of at most 50 paths');
  return value.map((p, i) => {
    if (typeof p !== 'string' || !path.isAbsolute(p) || p.includes('\0'))
      throw new IpcArgumentError(channel, `paths[${i}]`, 'should be an absolute path');
    return p;
  });
}
